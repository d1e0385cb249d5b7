import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { auditEvents, recipeVersions, testRuns, type TestRun } from "@/db/schema";
import { appendAudit, storedNamesOf } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { dataEntryProblem } from "@/lib/signatures/rules";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { assertReadyToPerform } from "./ready-to-perform";
import { refreshOutcome } from "./refresh-outcome";
import { getRunRow, runContent } from "./run-content";
import { todayUtc } from "@/lib/format/date";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { raiseNonconformance } from "@/lib/server/nonconformances/raise";
import { openNcForSource } from "@/lib/server/nonconformances/shared";
import { assertCitedInstrumentsCalibrated } from "@/lib/server/instruments/calibration-gate";

/**
 * "Performed" by the run's technician moves an open run to performed; "verified"
 * by a second person locks it. The signature binds to the hash the signer saw:
 * if the run changed since, nothing is signed.
 */
export async function signRun(input: {
  userId: string;
  password: string;
  runId: string;
  meaning: "performed" | "verified";
  contentHash: string;
}) {
  const signer = await verifySigner({ userId: input.userId, password: input.password });
  return getDb().transaction(async (tx) => {
    const run = await getRunRow(tx, input.runId);
    if (!run) throw new UserFacingError("This test run does not exist.", { kind: "not_found" });
    const expected = input.meaning === "performed" ? "open" : "performed";
    if (run.status !== expected) {
      throw new UserFacingError(
        input.meaning === "performed"
          ? `This run is ${run.status}; only an open run can be signed as performed.`
          : `This run is ${run.status}; only a performed run can be verified.`,
      );
    }
    if (input.meaning === "performed" && run.technicianId !== signer.id)
      throw new UserFacingError("Only the technician assigned to this run signs it as performed.", {
        kind: "forbidden",
      });
    const { hash, samples } = await runContent(tx, run);
    if (hash !== input.contentHash)
      throw new UserFacingError(
        "The run changed after you opened it. Reload the page, check the data again and sign.",
      );
    if (samples.length === 0)
      throw new UserFacingError("Record at least one sample before signing.");
    if (input.meaning === "performed") await assertReadyToPerform(tx, run, signer);
    if (input.meaning === "performed") await assertCitedInstrumentsCalibrated(tx, run.id);
    if (input.meaning === "verified") {
      const problem = dataEntryProblem(await dataEntrants(tx, run.id), signer.id);
      if (problem) throw new UserFacingError(problem);
    }
    const outcome = await refreshOutcome(tx, run);
    const status = input.meaning === "performed" ? "performed" : "verified";
    await applySignature(tx, {
      signer,
      recordType: "test_run",
      recordId: run.id,
      meaning: input.meaning,
      contentHash: hash,
    });
    await tx.update(testRuns).set({ status }).where(eq(testRuns.id, run.id));
    await appendAudit(tx, signer, {
      eventType: input.meaning === "performed" ? "test_run.performed" : "test_run.verified",
      recordType: "test_run",
      recordId: run.id,
      old: { status: run.status },
      new: { status, contentHash: hash, outcome: outcome.outcome, code: outcome.code },
    });
    const nonconformance =
      input.meaning === "verified" && outcome.outcome === "fail"
        ? await raiseForFailedRun(tx, run, signer.id)
        : null;
    return { status, outcome: outcome.outcome, nonconformance };
  });
}

/** The audited edits of a run's data; opening the run or signing it is not data entry. */
const DATA_EVENTS = (
  [
    "test_run.sample_added",
    "test_run.sample_removed",
    "test_run.data_saved",
    "test_run.csv_imported",
  ] as const
).flatMap(storedNamesOf);

async function dataEntrants(tx: Tx, runId: string): Promise<string[]> {
  const rows = await tx
    .selectDistinct({ actorId: auditEvents.actorId })
    .from(auditEvents)
    .where(
      and(
        eq(auditEvents.recordType, "test_run"),
        eq(auditEvents.recordId, runId),
        inArray(auditEvents.action, DATA_EVENTS),
      ),
    );
  return rows.flatMap((r) => (r.actorId ? [r.actorId] : []));
}

/**
 * A run verified as Fail opens its nonconformance in the verification's own transaction, so
 * no failed result is ever left without an owner (a run already owned by one is not raised twice).
 */
async function raiseForFailedRun(tx: Tx, run: TestRun, verifierId: string) {
  const existing = await openNcForSource(tx, "run", run.id);
  if (existing) return existing;
  const [version] = await tx
    .select({ recipeId: recipeVersions.recipeId })
    .from(recipeVersions)
    .where(eq(recipeVersions.id, run.recipeVersionId));
  const label = run.revision > 1 ? `${run.number} rev. ${run.revision}` : run.number;
  return raiseNonconformance(tx, {
    source: { kind: "run", id: run.id, label },
    title: `${label} verified as Fail (${TEST_TYPE_LABELS[run.testType].toLowerCase()})`,
    description: `Test run ${label} was verified with the outcome Fail against its specification. Contain what was cleaned on this recipe and part family since the last passing test.`,
    severity: "major",
    detectedOn: todayUtc(),
    recipeId: version?.recipeId ?? null,
    partFamilyId: run.partFamilyId,
    actorId: verifierId,
  });
}
