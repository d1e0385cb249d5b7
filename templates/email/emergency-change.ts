import { renderEmail } from "./layout";

/** Approvers learn at once that a change is in force before their approval. */
export function emergencyImplementedEmail(input: {
  number: string;
  title: string;
  engineer: string;
  version: number;
  approvalDueOn: string;
  changeRequestId: string;
}) {
  return renderEmail({
    subject: `Emergency change ${input.number} in force before approval: ${input.title}`,
    paragraphs: [
      `${input.engineer} implemented change request ${input.number} "${input.title}" as an emergency: recipe version ${input.version} is in force now, before approval.`,
      `Approve or reject it by ${input.approvalDueOn}. Requalification evidence follows after approval.`,
    ],
    link: { label: "Open the change request", path: `/changes/${input.changeRequestId}` },
  });
}

/** The approval of an emergency change is overdue: approvers and administrators are told once. */
export function emergencyOverdueEmail(input: {
  number: string;
  title: string;
  approvalDueOn: string;
  implementedOn: string;
  changeRequestId: string;
}) {
  return renderEmail({
    subject: `Emergency change ${input.number} approval overdue: ${input.title}`,
    paragraphs: [
      `Emergency change ${input.number} "${input.title}" has been in force since ${input.implementedOn} without approval. Its approval was due by ${input.approvalDueOn}.`,
      "An approver must approve or reject it now; rejecting it puts the previous recipe version back in force.",
    ],
    link: { label: "Open the change request", path: `/changes/${input.changeRequestId}` },
  });
}
