"use server";

import { defineAction } from "@/lib/actions/define-action";
import { runIdSchema } from "@/lib/schemas/evidence";
import { labDetailsSchema } from "@/lib/schemas/lab-details";
import { citeMethodsSchema } from "@/lib/schemas/lab-method";
import { citeMethods } from "@/lib/server/evidence/cite-methods";
import { saveLabDetails } from "@/lib/server/lab-report/save-lab-details";
import { citeInstrumentsSchema } from "@/lib/schemas/instrument";
import { citeInstruments } from "@/lib/server/instruments/cite-instruments";

export const saveLabDetailsAction = defineAction({
  permission: "evidence.record",
  input: runIdSchema,
  alsoReads: [labDetailsSchema],
  run: async ({ user, input, parse }) => {
    await saveLabDetails(
      { id: user.id, name: user.name },
      { runId: input.runId, details: parse(labDetailsSchema) },
    );
    return { message: "Extraction, analysis and component details saved." };
  },
  revalidate: (input) => [`/evidence/runs/${input.runId}`],
});

/** The instruments the run used; retired or out-of-service ones are refused by name. */
export const citeInstrumentsAction = defineAction({
  permission: "evidence.record",
  input: citeInstrumentsSchema,
  run: async ({ user, input }) => {
    const { instruments } = await citeInstruments(user, input);
    return {
      message:
        instruments.length === 0 ? "No instrument cited." : `Cited: ${instruments.join(", ")}.`,
    };
  },
  revalidate: (input) => [`/evidence/runs/${input.runId}`],
});

/** The approved method versions the run used; refused for a draft or superseded version. */
export const citeMethodsAction = defineAction({
  permission: "evidence.record",
  input: citeMethodsSchema,
  run: async ({ user, input }) => {
    const { cited } = await citeMethods({ id: user.id, name: user.name }, input);
    return { message: cited.length ? `Methods used: ${cited.join(", ")}.` : "No method cited." };
  },
  revalidate: (input) => [`/evidence/runs/${input.runId}`],
});
