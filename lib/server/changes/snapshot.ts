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
  return (await loadNarratives(db, [documentId])).get(documentId) ?? null;
}

/** The first version of each narrative document (a change's narrative has one), keyed by document. */
export async function loadNarratives(db: Executor, documentIds: (string | null)[]) {
  const ids = [...new Set(documentIds.filter((d): d is string => d !== null))];
  const first = new Map<string, typeof documentVersions.$inferSelect>();
  if (ids.length === 0) return first;
  const rows = await db
    .select()
    .from(documentVersions)
    .where(inArray(documentVersions.documentId, ids))
    .orderBy(asc(documentVersions.version));
  for (const v of rows) if (!first.has(v.documentId)) first.set(v.documentId, v);
  return first;
}

/** The gate of one change request, read from the stored runs and their signatures. */
export async function loadGate(db: Executor, changeRequestId: string) {
  return (await loadGates(db, [changeRequestId])).get(changeRequestId)!;
}

/**
 * The gates of several change requests in a fixed number of statements (the queue shows every
 * change in requalification; a read per change would grow with the plant).
 */
export async function loadGates(db: Executor, changeRequestIds: string[]) {
  const ids = [...new Set(changeRequestIds)];
  // Sequential awaits: the executor may be a transaction, which runs one statement at a time.
  const allRequirements = ids.length
    ? await db
        .select()
        .from(changeRequestTests)
        .where(inArray(changeRequestTests.changeRequestId, ids))
        .orderBy(asc(changeRequestTests.testType))
    : [];
  const crs = ids.length
    ? await db
        .select({ id: changeRequests.id, toVersionId: changeRequests.toVersionId })
        .from(changeRequests)
        .where(inArray(changeRequests.id, ids))
    : [];
  const tiedCandidates = ids.length
    ? await db
        .select({
          id: testRuns.id,
          testType: testRuns.testType,
          changeRequestId: testRuns.changeRequestId,
          recipeVersionId: testRuns.recipeVersionId,
        })
        .from(testRuns)
        .where(inArray(testRuns.changeRequestId, ids))
    : [];
  const reqIds = allRequirements.map((r) => r.id);
  const allLinks = reqIds.length
    ? await db
        .select()
        .from(changeRequestEvidence)
        .where(inArray(changeRequestEvidence.requirementId, reqIds))
    : [];
  // A run the evidence feature tied to a change request counts for the requirement of its test type, if it tested the proposed version.
  const toVersion = new Map(crs.map((c) => [c.id, c.toVersionId]));
  const allTied = tiedCandidates.filter(
    (t) =>
      t.changeRequestId !== null &&
      toVersion.get(t.changeRequestId) != null &&
      t.recipeVersionId === toVersion.get(t.changeRequestId),
  );
  const runIds = [...new Set([...allLinks.map((l) => l.testRunId), ...allTied.map((t) => t.id)])];
  const runs = runIds.length
    ? await db.select().from(testRuns).where(inArray(testRuns.id, runIds))
    : [];
  const counts = runIds.length
    ? await db
        .select({ runId: testSamples.runId, cycleNumber: testSamples.cycleNumber })
        .from(testSamples)
        .where(inArray(testSamples.runId, runIds))
    : [];
  const sigs = runIds.length
    ? await db
        .select()
        .from(signatures)
        .where(and(eq(signatures.recordType, "test_run"), inArray(signatures.recordId, runIds)))
    : [];
  const runById = new Map(runs.map((r) => [r.id, r]));
  const sampleCount = new Map<string, number>();
  const cyclesOf = new Map<string, Set<string>>();
  for (const c of counts) {
    sampleCount.set(c.runId, (sampleCount.get(c.runId) ?? 0) + 1);
    if (c.cycleNumber) {
      const set = cyclesOf.get(c.runId) ?? new Set<string>();
      set.add(c.cycleNumber);
      cyclesOf.set(c.runId, set);
    }
  }
  const gateRun = (id: string): GateRun & { id: string } => {
    const run = runById.get(id)!;
    return {
      id,
      number: run.number,
      testType: run.testType,
      outcome: run.outcome,
      status: run.status,
      sampleCount: sampleCount.get(id) ?? 0,
      cycleCount: cyclesOf.get(id)?.size ?? 0,
      performedBy: sigs
        .filter((s) => s.recordId === id && s.meaning === "performed")
        .map((s) => s.userId),
      verifiedBy: sigs
        .filter((s) => s.recordId === id && s.meaning === "verified")
        .map((s) => s.userId),
    };
  };
  const gates = new Map<
    string,
    {
      requirements: typeof allRequirements;
      linked: Map<string, (GateRun & { id: string })[]>;
      gate: ReturnType<typeof evaluateGate>;
    }
  >();
  for (const id of ids) {
    const requirements = allRequirements.filter((r) => r.changeRequestId === id);
    const tied = allTied.filter((t) => t.changeRequestId === id);
    const linked = new Map<string, (GateRun & { id: string })[]>();
    for (const req of requirements) {
      const runIdsOfReq = new Set([
        ...allLinks.filter((l) => l.requirementId === req.id).map((l) => l.testRunId),
        ...tied.filter((t) => t.testType === req.testType).map((t) => t.id),
      ]);
      linked.set(req.id, [...runIdsOfReq].map(gateRun));
    }
    const gate = evaluateGate(
      requirements.map((r) => ({
        id: r.id,
        testType: r.testType as TestType,
        samples: r.samples,
        cycles: r.minCycles,
      })),
      linked,
    );
    gates.set(id, { requirements, linked, gate });
  }
  return gates;
}

/** Active users holding a role, for the e-mail to whoever acts next. */
export async function usersWithRole(db: Executor, role: Role) {
  return db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .innerJoin(userRoles, eq(userRoles.userId, users.id))
    .where(and(eq(userRoles.role, role), eq(users.active, true)));
}
