import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import type { Executor } from "@/db/client";
import {
  changeRequestEvidence,
  changeRequests,
  changeRequestTests,
  documentVersions,
  signatures,
  testSamples,
  testRuns,
  users,
  userRoles,
  type Role,
} from "@/db/schema";
import { evaluateGate, type GateRun } from "@/lib/changes/gate";
import type { TestType } from "@/lib/recipes/test-types";

export { loadRecipeSnapshot, writeRecipeContent } from "@/db/recipe-content";

export async function loadNarrative(db: Executor, documentId: string | null) {
  if (!documentId) return null;
  const [v] = await db.select().from(documentVersions).where(eq(documentVersions.documentId, documentId)).orderBy(asc(documentVersions.version));
  return v ?? null;
}

/** The gate of one change request, read from the stored runs and their signatures. */
export async function loadGate(db: Executor, changeRequestId: string) {
  const requirements = await db.select().from(changeRequestTests).where(eq(changeRequestTests.changeRequestId, changeRequestId)).orderBy(asc(changeRequestTests.testType));
  const reqIds = requirements.map((r) => r.id);
  const links = reqIds.length ? await db.select().from(changeRequestEvidence).where(inArray(changeRequestEvidence.requirementId, reqIds)) : [];
  // A run the evidence feature tied to this change request counts for the requirement of its test type, if it tested the proposed version.
  const [cr] = await db.select({ toVersionId: changeRequests.toVersionId }).from(changeRequests).where(eq(changeRequests.id, changeRequestId));
  const tied = cr?.toVersionId
    ? await db.select({ id: testRuns.id, testType: testRuns.testType }).from(testRuns).where(and(eq(testRuns.changeRequestId, changeRequestId), eq(testRuns.recipeVersionId, cr.toVersionId)))
    : [];
  const runIds = [...new Set([...links.map((l) => l.testRunId), ...tied.map((t) => t.id)])];
  const runs = runIds.length ? await db.select().from(testRuns).where(inArray(testRuns.id, runIds)) : [];
  const counts = runIds.length ? await db.select({ runId: testSamples.runId }).from(testSamples).where(inArray(testSamples.runId, runIds)) : [];
  const sigs = runIds.length
    ? await db.select().from(signatures).where(and(eq(signatures.recordType, "test_run"), inArray(signatures.recordId, runIds)))
    : [];
  const gateRun = (id: string): GateRun & { id: string } => {
    const run = runs.find((r) => r.id === id)!;
    return {
      id,
      number: run.number,
      testType: run.testType,
      outcome: run.outcome,
      status: run.status,
      sampleCount: counts.filter((c) => c.runId === id).length,
      performedBy: sigs.filter((s) => s.recordId === id && s.meaning === "performed").map((s) => s.userId),
      verifiedBy: sigs.filter((s) => s.recordId === id && s.meaning === "verified").map((s) => s.userId),
    };
  };
  const linked = new Map<string, (GateRun & { id: string })[]>();
  for (const req of requirements) {
    const ids = new Set([...links.filter((l) => l.requirementId === req.id).map((l) => l.testRunId), ...tied.filter((t) => t.testType === req.testType).map((t) => t.id)]);
    linked.set(req.id, [...ids].map(gateRun));
  }
  const gate = evaluateGate(
    requirements.map((r) => ({ id: r.id, testType: r.testType as TestType, samples: r.samples })),
    linked,
  );
  return { requirements, linked, gate };
}

/** Active users holding a role, for the e-mail to whoever acts next. */
export async function usersWithRole(db: Executor, role: Role) {
  return db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .innerJoin(userRoles, eq(userRoles.userId, users.id))
    .where(and(eq(userRoles.role, role), eq(users.active, true)));
}
