import "server-only";
import { and, asc, eq, inArray, isNull } from "drizzle-orm";
import { getDb, type Executor, type Tx } from "@/db/client";
import { changeEffectivenessChecks, changeRequests, signatures, testRuns } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { evaluateEffectiveness, type EffectivenessResult } from "@/lib/changes/effectiveness";
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
 * The one place a failed effectiveness check leads on from: it records the failure
 * (audited) and is where the nonconformance is opened (issue #13 item 1, source
 * "change_effectiveness"). The nonconformance service is built on another branch; its call
 * belongs here, in this transaction, once both are merged.
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
}
