"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { invalid, readJsonPayload, type FormState } from "@/lib/actions/result";
import { deliverSoon } from "@/lib/email/deliver";
import { changeIdSchema, endChangeSchema, intervalSchema, linkEvidenceSchema, openChangeSchema, proposalSchema, signedStepSchema } from "@/lib/schemas/change";
import { authorize } from "@/lib/server/auth/current-user";
import { approveChange } from "@/lib/server/changes/approve-change";
import { assessChange } from "@/lib/server/changes/assess-change";
import { closeChange } from "@/lib/server/changes/close-change";
import { endChange } from "@/lib/server/changes/end-change";
import { linkEvidence } from "@/lib/server/changes/link-evidence";
import { openChangeRequest } from "@/lib/server/changes/open-change-request";
import { reopenChange } from "@/lib/server/changes/reopen-change";
import { saveProposal } from "@/lib/server/changes/save-proposal";
import { setRequalificationInterval } from "@/lib/server/changes/set-requalification-interval";
import { startRequalification } from "@/lib/server/changes/start-requalification";
import { verifyChange } from "@/lib/server/changes/verify-change";
import { toActionFailure } from "@/lib/server/errors";

function refresh(changeRequestId: string) {
  revalidatePath(`/changes/${changeRequestId}`);
  revalidatePath("/changes");
  revalidatePath("/systems", "layout");
}

export async function openChangeAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("change.draft");
  if (!auth.ok) return auth;
  const parsed = openChangeSchema.safeParse({ recipeId: formData.get("recipeId"), title: formData.get("title"), kind: formData.get("kind") });
  if (!parsed.success) return invalid(parsed.error);
  let id: string;
  try {
    id = (await openChangeRequest(auth.user, parsed.data)).id;
  } catch (error) {
    return toActionFailure(error);
  }
  refresh(id);
  redirect(`/changes/${id}`);
}

export async function saveProposalAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("recipe.edit");
  if (!auth.ok) return auth;
  const payload = readJsonPayload(formData);
  if (!payload.ok) return payload;
  const parsed = proposalSchema.safeParse(payload.value);
  if (!parsed.success) return invalid(parsed.error, "Some values need attention. Nothing was saved; everything you typed is still here.");
  try {
    await saveProposal(auth.user, parsed.data);
    refresh(parsed.data.changeRequestId);
    return { ok: true, message: "Saved. The parameter diff and the computed impact below are up to date." };
  } catch (error) {
    return toActionFailure(error);
  }
}

type SignedService = (actor: { id: string; name: string }, input: { changeRequestId: string; password: string; contentHash: string }) => Promise<unknown>;

async function signedStep(permission: "change.draft" | "change.approve" | "change.verify", service: SignedService, formData: FormData, message: string): Promise<FormState> {
  const auth = await authorize(permission);
  if (!auth.ok) return auth;
  const parsed = signedStepSchema.safeParse({ changeRequestId: formData.get("changeRequestId"), password: formData.get("password"), contentHash: formData.get("contentHash") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await service(auth.user, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
  deliverSoon();
  refresh(parsed.data.changeRequestId);
  return { ok: true, message };
}

export async function assessChangeAction(_prev: FormState, formData: FormData): Promise<FormState> {
  return signedStep("change.draft", assessChange, formData, "Signed and submitted for approval.");
}

export async function approveChangeAction(_prev: FormState, formData: FormData): Promise<FormState> {
  return signedStep("change.approve", approveChange, formData, "Signed: approved for implementation.");
}

export async function verifyChangeAction(_prev: FormState, formData: FormData): Promise<FormState> {
  return signedStep("change.verify", verifyChange, formData, "Signed: verified.");
}

export async function startRequalificationAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("change.draft");
  if (!auth.ok) return auth;
  const parsed = changeIdSchema.safeParse({ changeRequestId: formData.get("changeRequestId") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await startRequalification(auth.user, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
  deliverSoon();
  refresh(parsed.data.changeRequestId);
  return { ok: true, message: "Requalification started; the lab has been told." };
}

export async function closeChangeAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("recipe.make_effective");
  if (!auth.ok) return auth;
  const parsed = changeIdSchema.safeParse({ changeRequestId: formData.get("changeRequestId") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await closeChange(auth.user, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
  deliverSoon();
  refresh(parsed.data.changeRequestId);
  return { ok: true, message: "Closed: the new recipe version is effective." };
}

export async function linkEvidenceAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("evidence.record");
  if (!auth.ok) return auth;
  const parsed = linkEvidenceSchema.safeParse({ changeRequestId: formData.get("changeRequestId"), requirementId: formData.get("requirementId"), testRunId: formData.get("testRunId") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await linkEvidence(auth.user, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
  refresh(parsed.data.changeRequestId);
  return { ok: true, message: "Linked." };
}

async function ending(how: "reject" | "withdraw" | "reopen", formData: FormData): Promise<FormState> {
  const auth = await authorize(how === "reject" ? "change.approve" : "change.draft");
  if (!auth.ok) return auth;
  const parsed = endChangeSchema.safeParse({ changeRequestId: formData.get("changeRequestId"), reason: formData.get("reason") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    if (how === "reopen") await reopenChange(auth.user, parsed.data);
    else await endChange(auth.user, { ...parsed.data, how });
  } catch (error) {
    return toActionFailure(error);
  }
  deliverSoon();
  refresh(parsed.data.changeRequestId);
  return { ok: true, message: how === "reopen" ? "Reopened for editing." : how === "reject" ? "Rejected." : "Withdrawn." };
}

export async function rejectChangeAction(_prev: FormState, formData: FormData) {
  return ending("reject", formData);
}
export async function withdrawChangeAction(_prev: FormState, formData: FormData) {
  return ending("withdraw", formData);
}
export async function reopenChangeAction(_prev: FormState, formData: FormData) {
  return ending("reopen", formData);
}

export async function setIntervalAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("recipe.edit");
  if (!auth.ok) return auth;
  const parsed = intervalSchema.safeParse({ intervalId: formData.get("intervalId"), intervalMonths: formData.get("intervalMonths"), reason: formData.get("reason") });
  if (!parsed.success) return invalid(parsed.error);
  try {
    await setRequalificationInterval(auth.user, parsed.data);
  } catch (error) {
    return toActionFailure(error);
  }
  revalidatePath("/systems", "layout");
  revalidatePath("/queue");
  return { ok: true, message: `Requalify every ${parsed.data.intervalMonths} months.` };
}
