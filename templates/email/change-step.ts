import { renderEmail } from "./layout";
import { formatDate } from "@/lib/format/date";

/** A change request moved on and the recipient is the one who acts next. */
export function changeStepEmail(input: {
  number: string;
  title: string;
  status: string;
  actorName: string;
  nextStep: string;
  changeRequestId: string;
}) {
  return renderEmail({
    subject: `${input.number} ${input.status.toLowerCase()}: ${input.title}`,
    paragraphs: [
      `${input.actorName} moved change request ${input.number} "${input.title}" to "${input.status}".`,
      `Next: ${input.nextStep}`,
    ],
    link: { label: "Open the change request", path: `/changes/${input.changeRequestId}` },
  });
}

/** A validated recipe version × part family falls due for periodic requalification. */
export function requalificationDueEmail(input: {
  recipe: string;
  version: number;
  partFamily: string;
  due: string;
  overdue: boolean;
  recipeId: string;
}) {
  return renderEmail({
    subject: `Requalification ${input.overdue ? "overdue" : "due"}: ${input.recipe} v${input.version} × ${input.partFamily}`,
    paragraphs: [
      `The periodic requalification of recipe ${input.recipe} version ${input.version} for part family ${input.partFamily} ${input.overdue ? "was due" : "falls due"} on ${formatDate(input.due)}.`,
      "Plan the requalification tests, or open a change request if the recipe or its interval should change.",
    ],
    link: { label: "Open the recipe", path: `/systems/recipes/${input.recipeId}` },
  });
}
