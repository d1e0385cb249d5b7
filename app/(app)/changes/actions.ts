"use server";

import { defineAction, type RevalidateTarget } from "@/lib/actions/define-action";
import {
  changeIdSchema,
  endChangeSchema,
  intervalSchema,
  linkEvidenceSchema,
  openChangeSchema,
  openInitialValidationSchema,
  proposalSchema,
  signedStepSchema,
} from "@/lib/schemas/change";
import { approveChange } from "@/lib/server/changes/approve-change";
import { assessChange } from "@/lib/server/changes/assess-change";
import { closeChange } from "@/lib/server/changes/close-change";
import { endChange } from "@/lib/server/changes/end-change";
import { linkEvidence } from "@/lib/server/changes/link-evidence";
import { openChangeRequest } from "@/lib/server/changes/open-change-request";
import { openInitialValidation } from "@/lib/server/changes/open-initial-validation";
import { reopenChange } from "@/lib/server/changes/reopen-change";
import { saveProposal } from "@/lib/server/changes/save-proposal";
import { setRequalificationInterval } from "@/lib/server/changes/set-requalification-interval";
import { startRequalification } from "@/lib/server/changes/start-requalification";
import { verifyChange } from "@/lib/server/changes/verify-change";
import {
  affectedDocumentSchema,
  customerDecisionSchema,
  emergencySchema,
  unaffectedSchema,
} from "@/lib/schemas/change-types";
import {
  addAffectedDocument,
  confirmDocumentUnaffected,
} from "@/lib/server/changes/affected-documents";
import { implementEmergency } from "@/lib/server/changes/implement-emergency";
import { recordCustomerDecision } from "@/lib/server/changes/customer-approval";

const refresh = (changeRequestId: string): RevalidateTarget[] => [
  `/changes/${changeRequestId}`,
  "/changes",
  ["/systems", "layout"],
];
const refreshChange = (input: { changeRequestId: string }) => refresh(input.changeRequestId);

export const openChangeAction = defineAction({
  permission: "change.draft",
  input: openChangeSchema,
  run: async ({ user, input }) => {
    const { id } = await openChangeRequest(user, input);
    return { redirect: `/changes/${id}`, id };
  },
  revalidate: (_input, result) => refresh(result.id),
});

/** A new recipe's draft first version, routed through its initial validation. */
export const openInitialValidationAction = defineAction({
  permission: "change.draft",
  input: openInitialValidationSchema,
  run: async ({ user, input }) => {
    const { id } = await openInitialValidation(user, input);
    return { redirect: `/changes/${id}`, id };
  },
  revalidate: (_input, result) => refresh(result.id),
});

export const saveProposalAction = defineAction({
  permission: "recipe.edit",
  input: proposalSchema,
  from: "payload",
  invalidMessage:
    "Some values need attention. Nothing was saved; everything you typed is still here.",
  run: async ({ user, input }) => {
    await saveProposal(user, input);
    return { message: "Saved. The parameter diff and the computed impact below are up to date." };
  },
  revalidate: refreshChange,
});

export const assessChangeAction = defineAction({
  permission: "change.draft",
  input: signedStepSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await assessChange(user, input);
    return { message: "Signed and submitted for approval." };
  },
  revalidate: refreshChange,
});

export const approveChangeAction = defineAction({
  permission: "change.approve",
  input: signedStepSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await approveChange(user, input);
    return { message: "Signed: approved for implementation." };
  },
  revalidate: refreshChange,
});

export const verifyChangeAction = defineAction({
  permission: "change.verify",
  input: signedStepSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await verifyChange(user, input);
    return { message: "Signed: verified." };
  },
  revalidate: refreshChange,
});

export const startRequalificationAction = defineAction({
  permission: "change.draft",
  input: changeIdSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await startRequalification(user, input);
    return { message: "Requalification started; the lab has been told." };
  },
  revalidate: refreshChange,
});

export const closeChangeAction = defineAction({
  permission: "recipe.make_effective",
  input: changeIdSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await closeChange(user, input);
    return { message: "Closed: the new recipe version is effective." };
  },
  revalidate: refreshChange,
});

export const linkEvidenceAction = defineAction({
  permission: "evidence.record",
  input: linkEvidenceSchema,
  run: async ({ user, input }) => {
    await linkEvidence(user, input);
    return { message: "Linked." };
  },
  revalidate: refreshChange,
});

export const rejectChangeAction = defineAction({
  permission: "change.approve",
  input: endChangeSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await endChange(user, { ...input, how: "reject" });
    return { message: "Rejected." };
  },
  revalidate: refreshChange,
});

export const withdrawChangeAction = defineAction({
  permission: "change.draft",
  input: endChangeSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await endChange(user, { ...input, how: "withdraw" });
    return { message: "Withdrawn." };
  },
  revalidate: refreshChange,
});

export const reopenChangeAction = defineAction({
  permission: "change.draft",
  input: endChangeSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await reopenChange(user, input);
    return { message: "Reopened for editing." };
  },
  revalidate: refreshChange,
});

export const setRequalificationIntervalAction = defineAction({
  permission: "recipe.edit",
  input: intervalSchema,
  run: async ({ user, input }) => {
    await setRequalificationInterval(user, input);
    return { message: `Requalify every ${input.intervalMonths} months.` };
  },
  revalidate: [["/systems", "layout"], "/queue"],
});

/** Emergency change: the engineer signs the assessed version into force before approval. */
export const implementEmergencyAction = defineAction({
  permission: "change.draft",
  input: emergencySchema,
  sendsMail: true,
  invalidMessage: "Not implemented: see the fields marked below. Nothing you typed was lost.",
  run: async ({ user, input }) => {
    await implementEmergency(user, input);
    return {
      message: `Signed: in force now as an emergency change. An approver must sign by ${input.approvalDueOn}.`,
    };
  },
  revalidate: refreshChange,
});

export const addAffectedDocumentAction = defineAction({
  permission: "change.draft",
  input: affectedDocumentSchema,
  run: async ({ user, input }) => {
    await addAffectedDocument(user, input);
    return { message: "Listed." };
  },
  revalidate: refreshChange,
});

export const confirmUnaffectedAction = defineAction({
  permission: "change.draft",
  input: unaffectedSchema,
  run: async ({ user, input }) => {
    await confirmDocumentUnaffected(user, input);
    return { message: "Confirmed unaffected." };
  },
  revalidate: refreshChange,
});

export const recordCustomerDecisionAction = defineAction({
  permission: "change.draft",
  input: customerDecisionSchema,
  invalidMessage: "Not recorded: see the fields marked below. Nothing you typed was lost.",
  run: async ({ user, input }) => {
    await recordCustomerDecision(user, input);
    return { message: `Recorded: the customer ${input.decision} the change.` };
  },
  revalidate: refreshChange,
});
