import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import type { Executor, Tx } from "@/db/client";
import {
  changeRequestEvidence,
  changeRequestTests,
  documentVersions,
  recipeParameters,
  recipeStages,
  recipeVersions,
  signatures,
  testResults,
  testRuns,
  users,
  userRoles,
  type Role,
} from "@/db/schema";
import { canonicalJson, sha256Hex } from "@/lib/audit";
import type { RecipeSnapshot } from "@/lib/recipes/diff";
import { evaluateGate, type GateRun } from "@/lib/recipes/gate";
import type { TestType } from "@/lib/recipes/test-types";

/** A recipe version's stages and parameters as the diff compares them, in stage order. */
export async function loadRecipeSnapshot(db: Executor, versionId: string): Promise<RecipeSnapshot> {
  const [version] = await db.select().from(recipeVersions).where(eq(recipeVersions.id, versionId));
  const stages = await db.select().from(recipeStages).where(eq(recipeStages.versionId, versionId)).orderBy(asc(recipeStages.position));
  const params = await db.select().from(recipeParameters).where(eq(recipeParameters.versionId, versionId));
  return {
    detergent: version?.detergent ?? null,
    notes: version?.notes ?? null,
    stages: stages.map((s) => ({
      name: s.name,
      kind: s.kind,
      mode: s.mode,
      parameters: params
        .filter((p) => p.stageId === s.id)
        .map((p) => ({ key: p.key, name: p.name, kind: p.kind, setpoint: p.setpoint, unit: p.unit, validatedLow: p.validatedLow, validatedHigh: p.validatedHigh, critical: p.critical })),
    })),
  };
}

/** Writes a recipe version's stages and parameters, replacing what a draft held before. */
export async function writeRecipeContent(tx: Tx, versionId: string, content: RecipeSnapshot) {
  await tx.delete(recipeParameters).where(eq(recipeParameters.versionId, versionId));
  await tx.delete(recipeStages).where(eq(recipeStages.versionId, versionId));
  await tx.update(recipeVersions).set({ detergent: content.detergent, notes: content.notes }).where(eq(recipeVersions.id, versionId));
  for (const [i, s] of content.stages.entries()) {
    const [stage] = await tx.insert(recipeStages).values({ versionId, position: i + 1, name: s.name, kind: s.kind as never, mode: s.mode as never }).returning();
    if (s.parameters.length) await tx.insert(recipeParameters).values(s.parameters.map((p) => ({ ...p, versionId, stageId: stage.id })));
  }
}

/** The narrative's text: paragraphs of a Tiptap-shaped document, joined by blank lines. */
export function narrativeText(content: unknown): string {
  const doc = content as { content?: { content?: { text?: string }[] }[] } | null;
  return (doc?.content ?? []).map((block) => (block.content ?? []).map((n) => n.text ?? "").join("")).join("\n\n");
}

/** Plain text stored as a Tiptap-shaped document, so the rich-text editor can open it unchanged. */
export function narrativeDocument(text: string) {
  const paragraphs = text.split(/\n\s*\n/).map((p) => p.trim()).filter(Boolean);
  return { type: "doc", content: paragraphs.map((p) => ({ type: "paragraph", content: [{ type: "text", text: p }] })) };
}

export async function loadNarrative(db: Executor, documentId: string | null) {
  if (!documentId) return null;
  const [v] = await db.select().from(documentVersions).where(eq(documentVersions.documentId, documentId)).orderBy(asc(documentVersions.version));
  return v ?? null;
}

/** What the signatures on a change request bind to: the proposal, the narrative, and the assessment. */
export function changeContentHash(input: {
  number: string;
  title: string;
  kind: string;
  partFamilyId: string | null;
  fromVersionId: string | null;
  proposal: RecipeSnapshot;
  narrative: unknown;
  impact: string | null;
  raiseReason: string | null;
  requirements: { testType: string; samples: number }[];
}) {
  return sha256Hex(canonicalJson(input as unknown as Record<string, unknown>));
}

/** The gate of one change request, read from the stored runs and their signatures. */
export async function loadGate(db: Executor, changeRequestId: string) {
  const requirements = await db.select().from(changeRequestTests).where(eq(changeRequestTests.changeRequestId, changeRequestId)).orderBy(asc(changeRequestTests.testType));
  const reqIds = requirements.map((r) => r.id);
  const links = reqIds.length ? await db.select().from(changeRequestEvidence).where(inArray(changeRequestEvidence.requirementId, reqIds)) : [];
  // A run the evidence feature tied to this change request counts for the requirement of its test type.
  const tied = await db.select({ id: testRuns.id, testType: testRuns.testType }).from(testRuns).where(eq(testRuns.changeRequestId, changeRequestId));
  const runIds = [...new Set([...links.map((l) => l.testRunId), ...tied.map((t) => t.id)])];
  const runs = runIds.length ? await db.select().from(testRuns).where(inArray(testRuns.id, runIds)) : [];
  const counts = runIds.length ? await db.select({ runId: testResults.runId }).from(testResults).where(inArray(testResults.runId, runIds)) : [];
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
