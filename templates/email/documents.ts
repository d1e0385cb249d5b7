import { renderEmail } from "./layout";
import { formatDate } from "@/lib/format/date";

interface DocRef {
  documentId: string;
  number: string;
  title: string;
  version: number;
}

const label = (d: DocRef) => `${d.number} version ${d.version} — ${d.title}`;
const link = (d: DocRef) => ({
  label: `Open ${d.number}`,
  path: `/documents/${d.documentId}?version=${d.version}`,
});
const day = (iso: string | null) => (iso ? `${formatDate(iso)} (UTC)` : "no date set");

export function reviewRequestedEmail(
  input: DocRef & { role: "reviewer" | "approver"; author: string; due: string | null },
) {
  const task = input.role === "approver" ? "approval" : "review";
  return renderEmail({
    subject: `${input.role === "approver" ? "Approval" : "Review"} requested: ${input.number}`,
    paragraphs: [
      `${input.author} asks for your ${task} of ${label(input)}.`,
      `Due: ${day(input.due)}. You will be asked for your password when you sign.`,
    ],
    link: link(input),
  });
}

export function sentBackEmail(input: DocRef & { by: string; comment: string; rejected: boolean }) {
  return renderEmail({
    subject: `${input.rejected ? "Rejected" : "Sent back"}: ${input.number}`,
    paragraphs: [
      `${input.by} ${input.rejected ? "rejected" : "sent back"} ${label(input)}. It is a draft again.`,
      `Comment: ${input.comment}`,
    ],
    link: link(input),
  });
}

export function approvedEmail(
  input: DocRef & { by: string; effectiveDate: string; effectiveNow: boolean },
) {
  return renderEmail({
    subject: `Approved: ${input.number}`,
    paragraphs: [
      `${input.by} approved ${label(input)}.`,
      input.effectiveNow
        ? `It is effective from ${input.effectiveDate}.`
        : `It becomes effective on ${input.effectiveDate}.`,
    ],
    link: link(input),
  });
}

export function reviewOverdueEmail(input: DocRef & { role: "reviewer" | "approver"; due: string }) {
  return renderEmail({
    subject: `Overdue ${input.role === "approver" ? "approval" : "review"}: ${input.number}`,
    paragraphs: [
      `Your ${input.role === "approver" ? "approval" : "review"} of ${label(input)} was due on ${day(input.due)} and is still open.`,
    ],
    link: link(input),
  });
}
