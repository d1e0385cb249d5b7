import "server-only";
import { and, eq, ne } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import {
  evidenceFiles,
  instrumentCalibrations,
  instruments,
  testRunInstruments,
  testRuns,
} from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { todayUtc } from "@/lib/format/date";
import {
  dueDateFrom,
  lastPassingCalibration,
  suspectRuns,
  usesExpiry,
  type CitingRun,
} from "@/lib/instruments/calibration";
import type { CalibrationInput } from "@/lib/schemas/instrument";
import { invalidError } from "@/lib/server/errors";
import { raiseNonconformance } from "@/lib/server/nonconformances/raise";
import { assertNotRetired, instrumentName, loadInstrument } from "./shared";

/**
 * Records a calibration with its result as found and the date the next is due (from the
 * instrument's interval unless given). A result out of tolerance opens a lab nonconformance in the
 * same transaction, containing the runs that cited the instrument since its last passing
 * calibration.
 */
export async function recordCalibrationIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  input: CalibrationInput,
  now = new Date(),
) {
  const instrument = await loadInstrument(tx, input.instrumentId);
  assertNotRetired(instrument);
  if (usesExpiry(instrument.kind))
    throw invalidError(
      "A test-ink set is not calibrated: enter the new set's expiry date on the instrument instead.",
      "instrumentId",
    );
  if (input.calibratedOn > todayUtc(now))
    throw invalidError("The calibration date cannot be after today.", "calibratedOn");
  const dueOn =
    input.dueOn ?? dueDateFrom(input.calibratedOn, instrument.calibrationIntervalMonths ?? 12);
  if (dueOn <= input.calibratedOn)
    throw invalidError("The due date must be after the calibration date.", "dueOn");
  const certificate = input.certificateFileId
    ? (
        await tx.select().from(evidenceFiles).where(eq(evidenceFiles.id, input.certificateFileId))
      )[0]
    : null;
  if (input.certificateFileId && (!certificate || certificate.runId !== null))
    throw invalidError("Upload the certificate again: the stored file was not found.", "file");

  const earlier = await tx
    .select()
    .from(instrumentCalibrations)
    .where(eq(instrumentCalibrations.instrumentId, instrument.id));
  const [row] = await tx
    .insert(instrumentCalibrations)
    .values({
      ...input,
      dueOn,
      recordedBy: actor.id,
      createdAt: now.toISOString(),
    })
    .returning();
  // Only the latest calibration decides until when the instrument may be used.
  const latest = earlier.every((c) => c.calibratedOn <= row.calibratedOn);
  if (latest) await tx.update(instruments).set({ dueOn }).where(eq(instruments.id, instrument.id));

  let nonconformance: { id: string; number: string } | null = null;
  let suspects: CitingRun[] = [];
  if (row.result === "out_of_tolerance") {
    const lastPass = lastPassingCalibration(earlier, row);
    suspects = suspectRuns(await runsCiting(tx, instrument.id), lastPass, row.calibratedOn);
    nonconformance = await raiseNonconformance(
      tx,
      {
        source: {
          kind: "calibration",
          id: row.id,
          label: `${instrument.assetNumber} calibration of ${row.calibratedOn}`,
        },
        title: `${instrument.assetNumber} found out of tolerance on ${row.calibratedOn}`,
        description:
          `${instrumentName(instrument)} was found out of tolerance at its calibration on ${row.calibratedOn}` +
          (lastPass
            ? ` (last passing calibration ${lastPass.calibratedOn}).`
            : " (no earlier passing calibration on record).") +
          (suspects.length > 0
            ? ` ${suspects.length} test run${suspects.length === 1 ? "" : "s"} cited it since then: judge whether each result still stands.`
            : " No test run cited it since then."),
        severity: "major",
        detectedOn: row.calibratedOn,
        actorId: actor.id,
        items: suspects.map((r) => ({ kind: "run", id: r.id, label: r.label, lots: [], at: r.at })),
      },
      now,
    );
    await tx
      .update(instrumentCalibrations)
      .set({ nonconformanceId: nonconformance.id })
      .where(eq(instrumentCalibrations.id, row.id));
  }

  await appendAudit(
    tx,
    actor,
    {
      eventType: "instrument.calibrated",
      recordType: "instrument",
      recordId: instrument.id,
      old: { dueOn: instrument.dueOn },
      new: {
        calibrationId: row.id,
        calibratedOn: row.calibratedOn,
        dueOn,
        performer: row.performer,
        performedBy: row.performedBy,
        certificateNumber: row.certificateNumber,
        certificateSha256: certificate?.sha256 ?? null,
        result: row.result,
        note: row.note,
        nonconformance: nonconformance?.number ?? null,
        suspectRuns: suspects.map((r) => r.label),
      },
    },
    now,
  );
  return {
    calibration: { ...row, nonconformanceId: nonconformance?.id ?? null },
    nonconformance,
    suspects,
  };
}

export function recordCalibration(actor: { id: string; name: string }, input: CalibrationInput) {
  return getDb().transaction((tx) => recordCalibrationIn(tx, actor, input));
}

/** Every current run revision that cited the instrument, with its test date (or opening time). */
export async function runsCiting(tx: Tx, instrumentId: string): Promise<CitingRun[]> {
  const rows = await tx
    .select({
      id: testRuns.id,
      number: testRuns.number,
      revision: testRuns.revision,
      performedOn: testRuns.performedOn,
      createdAt: testRuns.createdAt,
    })
    .from(testRunInstruments)
    .innerJoin(testRuns, eq(testRuns.id, testRunInstruments.runId))
    .where(
      and(eq(testRunInstruments.instrumentId, instrumentId), ne(testRuns.status, "superseded")),
    );
  return rows.map((r) => ({
    id: r.id,
    label: r.revision > 1 ? `${r.number} rev. ${r.revision}` : r.number,
    at: r.performedOn ?? r.createdAt,
  }));
}
