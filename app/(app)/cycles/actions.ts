"use server";

import { defineAction } from "@/lib/actions/define-action";
import { cycleFormSchema } from "@/lib/schemas/cycle";
import { recordCycles } from "@/lib/server/cycles/record-cycles-now";

/** One cycle typed in from the washer's display or its printout, through the same service as the log import and the API. */
export const recordCycleAction = defineAction({
  permission: "evidence.record",
  input: cycleFormSchema,
  run: async ({ user, input }) => {
    const result = await recordCycles(
      { id: user.id, name: user.name },
      { source: "form", cycles: [input] },
    );
    const flagged = result.flagged[0];
    return {
      message: flagged
        ? `Cycle ${input.cycleNumber} recorded and flagged: ${flagged.reasons.join(" ")}`
        : `Cycle ${input.cycleNumber} recorded.`,
    };
  },
  revalidate: ["/cycles", "/lots"],
});
