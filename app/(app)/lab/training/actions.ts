"use server";

import { defineAction } from "@/lib/actions/define-action";
import { acknowledgeProcedureSchema, trainingSignOffSchema } from "@/lib/schemas/lab-method";
import { acknowledgeProcedure } from "@/lib/server/training/acknowledge-procedure";
import { signOffTraining } from "@/lib/server/training/sign-off-training";

const refresh = () => ["/lab/training", "/queue"];

/** The trainer signs a person's practical training on a lab method. */
export const signOffTrainingAction = defineAction({
  permission: "training.sign_off",
  input: trainingSignOffSchema,
  run: async ({ user, input }) => {
    const r = await signOffTraining(user, input);
    return { message: `Signed: ${r.person} is trained on ${r.method} until ${r.expiresOn}.` };
  },
  revalidate: refresh,
});

/** A person signs that they have read and understood a procedure version in force. */
export const acknowledgeProcedureAction = defineAction({
  permission: "training.acknowledge",
  input: acknowledgeProcedureSchema,
  run: async ({ user, input }) => {
    const r = await acknowledgeProcedure(user, input);
    return { message: `Signed: you acknowledged ${r.procedure}, current until ${r.expiresOn}.` };
  },
  revalidate: refresh,
});
