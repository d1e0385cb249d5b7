"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { z } from "zod";
import { deliverSoon } from "@/lib/email/deliver";
import { invalid, type FormState } from "@/lib/actions/result";
import { approveSchema, createDocumentSchema, reasonSchema, returnSchema, saveDraftSchema, signStepSchema, submitSchema } from "@/lib/schemas/document";
import { authorize } from "@/lib/server/auth/current-user";
import { approveVersion } from "@/lib/server/documents/approve-version";
import { createDocument } from "@/lib/server/documents/create-document";
import { retireDocument } from "@/lib/server/documents/retire-document";
import { returnToAuthor } from "@/lib/server/documents/return-to-author";
import { saveDraft, type SaveDraftResult } from "@/lib/server/documents/save-draft";
import { signReview } from "@/lib/server/documents/sign-review";
import { startNewVersion } from "@/lib/server/documents/start-new-version";
import { submitForReview } from "@/lib/server/documents/submit-for-review";
import { toActionFailure } from "@/lib/server/errors";

function refresh(documentId?: string) {
  revalidatePath("/documents");
  revalidatePath("/queue");
  if (documentId) revalidatePath(`/documents/${documentId}`);
}

const documentIdOf = (formData: FormData) => z.string().uuid().safeParse(formData.get("documentId")).data;

export async function createDocumentAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("document.draft");
  if (!auth.ok) return auth;
  const parsed = createDocumentSchema.safeParse(Object.fromEntries(formData));
  if (!parsed.success) return invalid(parsed.error);
  let created: { documentId: string };
  try {
    created = await createDocument(auth.user, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
  refresh();
  redirect(`/documents/${created.documentId}/edit`);
}

export type SaveDraftState = SaveDraftResult | { ok: false; conflict?: false; message: string };

/** Autosave from the editor: the draft's JSON and the counter it was read at. */
export async function saveDraftAction(input: { versionId: string; lockVersion: number; content: string; overwrite?: boolean }): Promise<SaveDraftState> {
  const auth = await authorize("document.draft");
  if (!auth.ok) return auth;
  const parsed = saveDraftSchema.safeParse(input);
  if (!parsed.success) return { ok: false, message: parsed.error.issues[0]?.message ?? "The draft could not be saved." };
  try {
    return await saveDraft(auth.user, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
}

export async function submitAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("document.submit");
  if (!auth.ok) return auth;
  const parsed = submitSchema.safeParse({
    versionId: formData.get("versionId"),
    lockVersion: formData.get("lockVersion"),
    contentHash: formData.get("contentHash"),
    reviewerIds: formData.getAll("reviewerIds"),
    approverId: formData.get("approverId") ?? undefined,
    routing: formData.get("routing") ?? undefined,
    dueDate: formData.get("dueDate") ?? undefined,
    password: formData.get("password"),
  });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await submitForReview(auth.user, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
  deliverSoon();
  refresh(documentIdOf(formData));
  return { ok: true, message: "Submitted and signed as authored. The first reviewers have been e-mailed." };
}

export async function signReviewAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("document.review");
  if (!auth.ok) return auth;
  const parsed = signStepSchema.safeParse(Object.fromEntries(formData));
  if (!parsed.success) return invalid(parsed.error);
  try {
    await signReview(auth.user, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
  deliverSoon();
  refresh(documentIdOf(formData));
  return { ok: true, message: "Signed as reviewed." };
}

export async function approveAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("document.approve");
  if (!auth.ok) return auth;
  const parsed = approveSchema.safeParse(Object.fromEntries(formData));
  if (!parsed.success) return invalid(parsed.error);
  let effectiveNow: boolean;
  try {
    ({ effectiveNow } = await approveVersion(auth.user, parsed.data));
  } catch (error) {
    return toActionFailure(error);
  }
  deliverSoon();
  refresh(documentIdOf(formData));
  return { ok: true, message: effectiveNow ? "Approved; the version is effective." : `Approved; it becomes effective on ${parsed.data.effectiveDate}.` };
}

async function returnAction(formData: FormData, decision: "sent_back" | "rejected"): Promise<FormState> {
  const auth = await authorize(decision === "rejected" ? "document.approve" : "document.review");
  if (!auth.ok) return auth;
  const parsed = returnSchema.safeParse({ versionId: formData.get("versionId"), comment: formData.get("comment") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await returnToAuthor(auth.user, { ...parsed.data, decision });
  } catch (error) {
    return toActionFailure(error);
  }
  deliverSoon();
  refresh(documentIdOf(formData));
  return { ok: true, message: decision === "rejected" ? "Rejected; the author has been told." : "Sent back; the author has been told." };
}

export async function sendBackAction(_prev: FormState, formData: FormData): Promise<FormState> {
  return returnAction(formData, "sent_back");
}

export async function rejectAction(_prev: FormState, formData: FormData): Promise<FormState> {
  return returnAction(formData, "rejected");
}

export async function newVersionAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("document.draft");
  if (!auth.ok) return auth;
  const parsed = reasonSchema.safeParse(Object.fromEntries(formData));
  if (!parsed.success) return invalid(parsed.error);
  let version: number;
  try {
    ({ version } = await startNewVersion(auth.user, parsed.data));
  } catch (error) {
    return toActionFailure(error);
  }
  refresh(parsed.data.documentId);
  redirect(`/documents/${parsed.data.documentId}/edit?version=${version}`);
}

export async function retireAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("document.approve");
  if (!auth.ok) return auth;
  const parsed = reasonSchema.safeParse(Object.fromEntries(formData));
  if (!parsed.success) return invalid(parsed.error);
  try {
    await retireDocument(auth.user, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
  refresh(parsed.data.documentId);
  return { ok: true, message: "Retired." };
}
