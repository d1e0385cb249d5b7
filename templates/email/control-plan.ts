import { renderEmail } from "./layout";
import { formatDateTime } from "@/lib/format/date";

/** A routine test of a control plan has become overdue. */
export function controlPlanOverdueEmail(input: {
  characteristic: string;
  tank: string | null;
  combination: string;
  frequency: string;
  dueAt: string;
  overdueAt: string;
  reactionPlan: string;
  planId: string;
}) {
  const what = `${input.characteristic}${input.tank ? ` on ${input.tank}` : ""}`;
  return renderEmail({
    subject: `Routine test overdue: ${what}, ${input.combination}`,
    paragraphs: [
      `The control plan of ${input.combination} asks for ${what.toLowerCase()} ${input.frequency.toLowerCase()}. The test was due from ${formatDateTime(input.dueAt)} and is overdue since ${formatDateTime(input.overdueAt)}.`,
      "Take and record the test now; until it is verified, the parts washed since the last test are not shown to be in control.",
      `Reaction plan when a result is out: ${input.reactionPlan}`,
    ],
    link: { label: "Open the control plan", path: `/control-plans/${input.planId}` },
  });
}
