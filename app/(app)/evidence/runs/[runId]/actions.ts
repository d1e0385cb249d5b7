"use server";

import { defineAction } from "@/lib/actions/define-action";
import { runIdSchema } from "@/lib/schemas/evidence";
import { labDetailsSchema } from "@/lib/schemas/lab-details";
import { saveLabDetails } from "@/lib/server/lab-report/save-lab-details";

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
