"use server";

import { defineAction } from "@/lib/actions/define-action";
import { bathLimitSchema, detergentSchema } from "@/lib/schemas/bath-plan";
import { saveDetergent } from "@/lib/server/bath/save-detergent";
import { setBathLimit } from "@/lib/server/bath/set-bath-limit";

export const saveDetergentAction = defineAction({
  permission: "bath.manage_intervals",
  input: detergentSchema,
  run: async ({ user, input }) => {
    await saveDetergent({ id: user.id, name: user.name }, input);
    return { message: `${input.name} saved in the detergent register.` };
  },
  revalidate: ["/evidence/bath"],
});

export const setBathLimitAction = defineAction({
  permission: "bath.manage_intervals",
  input: bathLimitSchema,
  run: async ({ user, input }) => {
    await setBathLimit({ id: user.id, name: user.name }, input);
    return { message: "Plan line saved." };
  },
  revalidate: (input) => [`/evidence/bath/${input.stageId}`],
});
