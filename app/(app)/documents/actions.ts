"use server";

import { z } from "zod";
import { defineAction, defineCallAction } from "@/lib/actions/define-action";
import {
  approveSchema,
  createDocumentSchema,
  reasonSchema,
  returnSchema,
  saveDraftSchema,
  signStepSchema,
  submitSchema,
} from "@/lib/schemas/document";
import { approveVersion } from "@/lib/server/documents/approve-version";
import { createDocument } from "@/lib/server/documents/create-document";
import { retireDocument } from "@/lib/server/documents/retire-document";
import { returnToAuthor } from "@/lib/server/documents/return-to-author";
import { saveDraft, type SaveDraftResult } from "@/lib/server/documents/save-draft";
import { signReview } from "@/lib/server/documents/sign-review";
import { startNewVersion } from "@/lib/server/documents/start-new-version";
import { submitForReview } from "@/lib/server/documents/submit-for-review";

function refresh(documentId?: string) {
  return ["/documents", "/queue", ...(documentId ? [`/documents/${documentId}`] : [])];
}

/** Signing forms name the version; they also send the document's id so its page is refreshed. */
const documentToRefresh = z.object({ documentId: z.string().optional() });
const refreshDocumentOf = (_input: unknown, _result: unknown, raw: unknown) =>
  refresh(z.string().uuid().safeParse(documentToRefresh.safeParse(raw).data?.documentId).data);

export const createDocumentAction = defineAction({
  permission: "document.draft",
  input: createDocumentSchema,
  run: async ({ user, input }) => {
    const { documentId } = await createDocument(user, input);
    return { redirect: `/documents/${documentId}/edit` };
  },
  revalidate: refresh(),
});

export type SaveDraftState = SaveDraftResult | { ok: false; conflict?: false; message: string };

/** Autosave from the editor: the draft's JSON and the counter it was read at. */
export const saveDraftAction = defineCallAction({
  permission: "document.draft",
  input: saveDraftSchema,
  run: ({ user, input }): Promise<SaveDraftState> => saveDraft(user, input),
});

export const submitAction = defineAction({
  permission: "document.submit",
  input: submitSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await submitForReview(user, input);
    return { message: "Submitted and signed as authored. The first reviewers have been e-mailed." };
  },
  alsoReads: [documentToRefresh],
  revalidate: refreshDocumentOf,
});

export const signReviewAction = defineAction({
  permission: "document.review",
  input: signStepSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await signReview(user, input);
    return { message: "Signed as reviewed." };
  },
  alsoReads: [documentToRefresh],
  revalidate: refreshDocumentOf,
});

export const approveAction = defineAction({
  permission: "document.approve",
  input: approveSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    const { effectiveNow } = await approveVersion(user, input);
    return {
      message: effectiveNow
        ? "Approved; the version is effective."
        : `Approved; it becomes effective on ${input.effectiveDate}.`,
    };
  },
  alsoReads: [documentToRefresh],
  revalidate: refreshDocumentOf,
});

export const sendBackAction = defineAction({
  permission: "document.review",
  input: returnSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await returnToAuthor(user, { ...input, decision: "sent_back" });
    return { message: "Sent back; the author has been told." };
  },
  alsoReads: [documentToRefresh],
  revalidate: refreshDocumentOf,
});

export const rejectAction = defineAction({
  permission: "document.approve",
  input: returnSchema,
  sendsMail: true,
  run: async ({ user, input }) => {
    await returnToAuthor(user, { ...input, decision: "rejected" });
    return { message: "Rejected; the author has been told." };
  },
  alsoReads: [documentToRefresh],
  revalidate: refreshDocumentOf,
});

export const newVersionAction = defineAction({
  permission: "document.draft",
  input: reasonSchema,
  run: async ({ user, input }) => {
    const { version } = await startNewVersion(user, input);
    return { redirect: `/documents/${input.documentId}/edit?version=${version}` };
  },
  revalidate: (input) => refresh(input.documentId),
});

export const retireAction = defineAction({
  permission: "document.approve",
  input: reasonSchema,
  run: async ({ user, input }) => {
    await retireDocument(user, input);
    return { message: "Retired." };
  },
  revalidate: (input) => refresh(input.documentId),
});
