import { renderEmail } from "./layout";
import { formatDate } from "@/lib/format/date";

/** To the person who now owns a nonconformance or one of its actions. */
export function ncAssignedEmail(input: {
  number: string;
  title: string;
  /** "nonconformance", "corrective action" or "preventive action". */
  what: string;
  dueOn: string | null;
  ncId: string;
}) {
  return renderEmail({
    subject: `${input.number}: ${input.what} assigned to you`,
    paragraphs: [
      `You own a ${input.what} of ${input.number}: ${input.title}.`,
      input.dueOn ? `It is due on ${formatDate(input.dueOn)}.` : "No due date is set yet.",
    ],
    link: { label: `Open ${input.number}`, path: `/nonconformances/${input.ncId}` },
  });
}

/** A reminder when an owner's work falls due, and again once it is overdue. */
export function ncDueEmail(input: {
  number: string;
  title: string;
  what: string;
  dueOn: string;
  overdue: boolean;
  ncId: string;
}) {
  const date = formatDate(input.dueOn);
  return renderEmail({
    subject: `${input.overdue ? "Overdue" : "Due"}: ${input.what} of ${input.number}`,
    paragraphs: [
      input.overdue
        ? `The ${input.what} of ${input.number} (${input.title}) was due on ${date} and is not done.`
        : `The ${input.what} of ${input.number} (${input.title}) falls due on ${date}.`,
    ],
    link: { label: `Open ${input.number}`, path: `/nonconformances/${input.ncId}` },
  });
}
