// Not "server-only": the demo seed drafts its methods under tsx; the action calls `draftMethod`.
import { and, eq, max } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { labMethods, testRuns } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { LabMethodInput } from "@/lib/schemas/lab-method";
import { UserFacingError } from "@/lib/server/errors";
import { methodLabel } from "./state";

/**
 * Drafts a lab method: version 1 of a new code, or the next version of an existing one (same
 * kind). One draft per code at a time, so an approver never has two competing texts.
 */
export async function draftMethodIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  input: LabMethodInput,
  now = new Date(),
) {
  const existing = await tx
    .select({
      id: labMethods.id,
      kind: labMethods.kind,
      version: labMethods.version,
      status: labMethods.status,
    })
    .from(labMethods)
    .where(eq(labMethods.code, input.code));
  if (existing.some((m) => m.kind !== input.kind))
    throw new UserFacingError(
      `${input.code} is already the code of a method of another kind: choose another code.`,
      { kind: "invalid", field: "code" },
    );
  const draft = existing.find((m) => m.status === "draft");
  if (draft)
    throw new UserFacingError(
      `${methodLabel({ code: input.code, version: draft.version })} is still a draft: approve it before drafting the next version.`,
      { kind: "conflict", field: "code" },
    );
  if (input.qualificationRunId) {
    if (input.kind !== "extraction")
      throw new UserFacingError("Only an extraction procedure is qualified by a declining test.", {
        kind: "invalid",
        field: "qualificationRunId",
      });
    const [run] = await tx
      .select({ testType: testRuns.testType, status: testRuns.status })
      .from(testRuns)
      .where(eq(testRuns.id, input.qualificationRunId));
    if (!run || run.testType !== "particle_cleanliness" || run.status !== "verified")
      throw new UserFacingError(
        "The qualification must be a verified particle cleanliness run whose declining test proved the procedure.",
        { kind: "invalid", field: "qualificationRunId" },
      );
  }
  const [{ top }] = await tx
    .select({ top: max(labMethods.version) })
    .from(labMethods)
    .where(and(eq(labMethods.code, input.code)));
  const version = (top ?? 0) + 1;
  const [row] = await tx
    .insert(labMethods)
    .values({
      code: input.code,
      version,
      kind: input.kind,
      name: input.name,
      details: input.details as Record<string, unknown>,
      qualificationRunId: input.qualificationRunId,
      trainingIntervalMonths: input.trainingIntervalMonths,
      createdBy: actor.id,
      createdAt: now.toISOString(),
    })
    .returning({ id: labMethods.id });
  await appendAudit(
    tx,
    actor,
    {
      eventType: "lab_method.drafted",
      recordType: "lab_method",
      recordId: row.id,
      new: {
        code: input.code,
        version,
        kind: input.kind,
        name: input.name,
        details: input.details as Record<string, unknown>,
        qualificationRun: input.qualificationRunId,
        trainingIntervalMonths: input.trainingIntervalMonths,
      },
    },
    now,
  );
  return { id: row.id, version };
}

export async function draftMethod(actor: AuditActor & { id: string }, input: LabMethodInput) {
  return getDb().transaction((tx) => draftMethodIn(tx, actor, input));
}
