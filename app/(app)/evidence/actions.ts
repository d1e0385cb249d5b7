"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { invalid, type FormState } from "@/lib/actions/result";
import {
  bathRecordSchema,
  createRunSchema,
  formToObject,
  maintenanceIntervalSchema,
  particleRunDataSchema,
  sampleIdSchema,
  reviseRunSchema,
  runIdSchema,
  SAMPLE_SCHEMAS,
  signRunSchema,
} from "@/lib/schemas/evidence";
import { authorize } from "@/lib/server/auth/current-user";
import { recordBathEntry } from "@/lib/server/bath/record-bath-entry";
import { setMaintenanceInterval } from "@/lib/server/bath/set-maintenance-interval";
import { toActionFailure, UserFacingError } from "@/lib/server/errors";
import { addSample } from "@/lib/server/evidence/add-sample";
import { createRun } from "@/lib/server/evidence/create-run";
import { removeSample } from "@/lib/server/evidence/remove-sample";
import { reviseRun } from "@/lib/server/evidence/revise-run";
import { getRunRow } from "@/lib/server/evidence/run-content";
import { saveRunData } from "@/lib/server/evidence/save-run-data";
import { signRun } from "@/lib/server/evidence/sign-run";
import { getDb } from "@/db/client";

const actorOf = (user: { id: string; name: string }) => ({ id: user.id, name: user.name });

export async function createRunAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("evidence.record");
  if (!auth.ok) return auth;
  const parsed = createRunSchema.safeParse(formToObject(formData));
  if (!parsed.success) return invalid(parsed.error);
  let runId: string;
  try {
    runId = (await createRun(actorOf(auth.user), parsed.data)).id;
  } catch (error) {
    return toActionFailure(error);
  }
  revalidatePath("/evidence");
  redirect(`/evidence/runs/${runId}`);
}

export async function addSampleAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("evidence.record");
  if (!auth.ok) return auth;
  const ids = runIdSchema.safeParse({ runId: formData.get("runId") });
  if (!ids.success) return invalid(ids.error);
  try {
    const run = await getRunRow(getDb(), ids.data.runId);
    if (!run) throw new UserFacingError("This test run does not exist.");
    const parsed = SAMPLE_SCHEMAS[run.testType].safeParse(formToObject(formData));
    if (!parsed.success) return invalid(parsed.error);
    await addSample(actorOf(auth.user), { runId: run.id, sample: parsed.data });
    revalidatePath(`/evidence/runs/${run.id}`);
    return { ok: true, message: `Sample ${parsed.data.sampleLabel} recorded.` };
  } catch (error) {
    return toActionFailure(error);
  }
}

export async function removeSampleAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("evidence.record");
  if (!auth.ok) return auth;
  const parsed = sampleIdSchema.safeParse(formToObject(formData));
  if (!parsed.success) return invalid(parsed.error);
  try {
    await removeSample(actorOf(auth.user), parsed.data);
    revalidatePath(`/evidence/runs/${parsed.data.runId}`);
    return { ok: true, message: "Sample removed." };
  } catch (error) {
    return toActionFailure(error);
  }
}

export async function saveRunDataAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("evidence.record");
  if (!auth.ok) return auth;
  const values = formToObject(formData);
  const ids = runIdSchema.safeParse(values);
  if (!ids.success) return invalid(ids.error);
  const parsed = particleRunDataSchema.safeParse(values);
  if (!parsed.success) return invalid(parsed.error);
  try {
    await saveRunData(actorOf(auth.user), { runId: ids.data.runId, data: parsed.data });
    revalidatePath(`/evidence/runs/${ids.data.runId}`);
    return { ok: true, message: "Extraction series and blank saved." };
  } catch (error) {
    return toActionFailure(error);
  }
}

export async function signRunAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const values = formToObject(formData);
  const meaning = values.meaning === "performed" ? "performed" : "verified";
  const auth = await authorize(meaning === "performed" ? "evidence.sign_performed" : "evidence.verify");
  if (!auth.ok) return auth;
  const parsed = signRunSchema.safeParse(values);
  if (!parsed.success) return invalid(parsed.error);
  try {
    await signRun({ userId: auth.user.id, ...parsed.data });
    revalidatePath(`/evidence/runs/${parsed.data.runId}`);
    return { ok: true, message: meaning === "performed" ? "Signed as performed." : "Verified; the run is locked." };
  } catch (error) {
    return toActionFailure(error);
  }
}

export async function reviseRunAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("evidence.record");
  if (!auth.ok) return auth;
  const parsed = reviseRunSchema.safeParse(formToObject(formData));
  if (!parsed.success) return invalid(parsed.error);
  let nextId: string;
  try {
    nextId = (await reviseRun(actorOf(auth.user), parsed.data)).id;
  } catch (error) {
    return toActionFailure(error);
  }
  revalidatePath("/evidence");
  redirect(`/evidence/runs/${nextId}`);
}

export async function recordBathAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("bath.record");
  if (!auth.ok) return auth;
  const parsed = bathRecordSchema.safeParse(formToObject(formData));
  if (!parsed.success) return invalid(parsed.error);
  try {
    await recordBathEntry(actorOf(auth.user), parsed.data);
    revalidatePath(`/evidence/bath/${parsed.data.stageId}`);
    return { ok: true, message: "Recorded in the bath log." };
  } catch (error) {
    return toActionFailure(error);
  }
}

export async function setIntervalAction(_prev: FormState, formData: FormData): Promise<FormState> {
  const auth = await authorize("bath.manage_intervals");
  if (!auth.ok) return auth;
  const parsed = maintenanceIntervalSchema.safeParse(formToObject(formData));
  if (!parsed.success) return invalid(parsed.error);
  try {
    await setMaintenanceInterval(actorOf(auth.user), parsed.data);
    revalidatePath(`/evidence/bath/${parsed.data.stageId}`);
    return { ok: true, message: "Interval saved." };
  } catch (error) {
    return toActionFailure(error);
  }
}
