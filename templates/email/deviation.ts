import { renderEmail } from "./layout";
import { formatDate } from "@/lib/format/date";

/** An active temporary deviation ends soon: plan the return to the validated values, or a change. */
export function deviationEndingEmail(input: {
  number: string;
  title: string;
  recipe: string;
  endsOn: string;
  daysLeft: number;
  deviationId: string;
}) {
  const when =
    input.daysLeft === 0
      ? "today is its last day"
      : `it ends after ${formatDate(input.endsOn)} (${input.daysLeft} day${input.daysLeft === 1 ? "" : "s"} left)`;
  return renderEmail({
    subject: `Deviation ${input.number} ends ${input.daysLeft === 0 ? "today" : `in ${input.daysLeft} day${input.daysLeft === 1 ? "" : "s"}`}: ${input.title}`,
    paragraphs: [
      `Temporary deviation ${input.number} "${input.title}" on recipe ${input.recipe} is active, and ${when}.`,
      "From the day after, production returns to the validated values. If the temporary values must stay, raise a new deviation or a change request now.",
    ],
    link: { label: "Open the deviation", path: `/deviations/${input.deviationId}` },
  });
}

/** A drafted deviation has its author's signature and waits for approval. */
export function deviationApprovalEmail(input: {
  number: string;
  title: string;
  recipe: string;
  authorName: string;
  deviationId: string;
}) {
  return renderEmail({
    subject: `Deviation ${input.number} waits for approval: ${input.title}`,
    paragraphs: [
      `${input.authorName} signed temporary deviation ${input.number} "${input.title}" on recipe ${input.recipe} and submitted it for approval.`,
      "Read its scope, temporary values, justification and risk, then approve it with your signature or ask the author to withdraw it.",
    ],
    link: { label: "Open the deviation", path: `/deviations/${input.deviationId}` },
  });
}
