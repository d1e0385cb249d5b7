import "server-only";
import { and, asc, eq, inArray, isNull } from "drizzle-orm";
import { getDb, type Executor, type Tx } from "@/db/client";
import { changeEffectivenessChecks, changeRequests, signatures, testRuns } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { evaluateEffectiveness, type EffectivenessResult } from "@/lib/changes/effectiveness";
import { todayUtc } from "@/lib/format/date";
import { raiseNonconformance } from "@/lib/server/nonconformances/raise";
import { openNcForSource } from "@/lib/server/nonconformances/shared";
import { getChangeControlSettings } from "./settings";

/** Opens the check when a change closes: the first N verified runs on its version from now on count. */
export async function openEffectivenessCheck(
  tx: Tx,
  actor: { id: string; name: string },
  cr: { id: string },
  now: Date,
) {
  const { effectivenessRuns } = await getChangeControlSettings(tx);
  const countsFrom = now.toISOString();
  await tx
    .insert(changeEffectivenessChecks)
    .values({ changeRequestId: cr.id, requiredRuns: effectivenessRuns, countsFrom });
  await appendAudit(
    tx,
    actor,
    {
      eventType: "change.effectiveness_check_opened",
      recordType: "change_request",
      recordId: cr.id,
      new: { requiredRuns: effectivenessRuns, countsFrom },
    },
    now,
  );
}

/** The live computation for each change's check (pending k of N, confirmed, failed). */
export async function loadEffectiveness(db: Executor, changeRequestIds: string[]) {
  const result = new Map<string, EffectivenessResult & { decidedAt: string | null }>();
  if (changeRequestIds.length === 0) return result;
  const checks = await db
    .select({ check: changeEffectivenessChecks, versionId: changeRequests.toVersionId })
    .from(changeEffectivenessChecks)
    .innerJoin(changeRequests, eq(changeRequests.id, changeEffectivenessChecks.changeRequestId))
    .where(inArray(changeEffectivenessChecks.changeRequestId, changeRequestIds));
  const versionIds = checks.flatMap((c) => (c.versionId ? [c.versionId] : []));
  const runs = versionIds.length
    ? await db
        .select({
          versionId: testRuns.recipeVersionId,
          number: testRuns.number,
          outcome: testRuns.outcome,
          verifiedAt: signatures.signedAt,
        })
        .from(testRuns)
        .innerJoin(
          signatures,
          and(
            eq(signatures.recordType, "test_run"),
            eq(signatures.recordId, testRuns.id),
            eq(signatures.meaning, "verified"),
          ),
        )
        .where(and(inArray(testRuns.recipeVersionId, versionIds), eq(testRuns.status, "verified")))
        .orderBy(asc(signatures.signedAt))
    : [];
  for (const { check, versionId } of checks) {
    const counted = runs.filter(
      (r) => r.versionId === versionId && r.verifiedAt >= check.countsFrom,
    );
    result.set(check.changeRequestId, {
      ...evaluateEffectiveness(check.requiredRuns, counted),
      decidedAt: check.decidedAt,
    });
  }
  return result;
}

/**
 * Records the checks the computation has decided since the last pass: confirmed, or failed
 * (through onEffectivenessFailed). Each is decided once; a pending one is left for later.
 */
export async function recordEffectivenessOutcomes(now = new Date()) {
  return getDb().transaction(async (tx) => {
    const pending = await tx
      .select({ id: changeEffectivenessChecks.changeRequestId })
      .from(changeEffectivenessChecks)
      .where(isNull(changeEffectivenessChecks.outcome));
    const results = await loadEffectiveness(
      tx,
      pending.map((p) => p.id),
    );
    let decided = 0;
    for (const [changeRequestId, r] of results) {
      if (r.state === "pending") continue;
      decided++;
      if (r.state === "failed") {
        await onEffectivenessFailed(tx, { changeRequestId, result: r }, now);
        continue;
      }
      await decide(tx, changeRequestId, "confirmed", r, now);
      await appendAudit(
        tx,
        SYSTEM_ACTOR,
        {
          eventType: "change.effectiveness_confirmed",
          recordType: "change_request",
          recordId: changeRequestId,
          new: { runs: r.counted, required: r.required },
        },
        now,
      );
    }
    return decided;
  });
}

async function decide(
  tx: Tx,
  changeRequestId: string,
  outcome: "confirmed" | "failed",
  r: EffectivenessResult,
  now: Date,
) {
  await tx
    .update(changeEffectivenessChecks)
    .set({ outcome, decidedAt: now.toISOString(), runs: r.counted })
    .where(
      and(
        eq(changeEffectivenessChecks.changeRequestId, changeRequestId),
        isNull(changeEffectivenessChecks.outcome),
      ),
    );
}

/**
 * The one place a failed effectiveness check leads on from: it records the failure (audited)
 * and opens its nonconformance in the same transaction, on the change's recipe and the failed
 * run's part family, so what was cleaned since the last passing test is contained. The
 * scheduler decides the check, so the system raises it.
 */
export async function onEffectivenessFailed(
  tx: Tx,
  input: { changeRequestId: string; result: EffectivenessResult },
  now: Date,
) {
  const r = input.result;
  await decide(tx, input.changeRequestId, "failed", r, now);
  await appendAudit(
    tx,
    SYSTEM_ACTOR,
    {
      eventType: "change.effectiveness_failed",
      recordType: "change_request",
      recordId: input.changeRequestId,
      new: { runs: r.counted, required: r.required, failedRun: r.failedRun! },
    },
    now,
  );
  if (await openNcForSource(tx, "change_effectiveness", input.changeRequestId)) return;
  const [cr] = await tx
    .select({
      number: changeRequests.number,
      recipeId: changeRequests.recipeId,
      toVersionId: changeRequests.toVersionId,
    })
    .from(changeRequests)
    .where(eq(changeRequests.id, input.changeRequestId));
  const [failed] =
    cr.toVersionId && r.failedRun
      ? await tx
          .select({ partFamilyId: testRuns.partFamilyId })
          .from(testRuns)
          .where(
            and(
              eq(testRuns.recipeVersionId, cr.toVersionId),
              eq(testRuns.number, r.failedRun),
              eq(testRuns.status, "verified"),
            ),
          )
          .limit(1)
      : [];
  await raiseNonconformance(
    tx,
    {
      source: { kind: "change_effectiveness", id: input.changeRequestId, label: cr.number },
      title: `${cr.number} effectiveness check failed`,
      description: `${r.failedRun ?? "A run"} did not pass among the first ${r.required} runs verified after ${cr.number} closed (${r.passed} passed): the change has not been shown to work.`,
      severity: "major",
      detectedOn: todayUtc(now),
      recipeId: cr.recipeId,
      partFamilyId: failed?.partFamilyId ?? null,
      actorId: null,
    },
    now,
  );
}
