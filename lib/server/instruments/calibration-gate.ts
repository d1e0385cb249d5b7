import "server-only";
import type { Executor } from "@/db/client";
import { todayUtc } from "@/lib/format/date";
import { calibrationSigningProblem } from "@/lib/instruments/calibration";
import { UserFacingError } from "@/lib/server/errors";
import { citedInstruments } from "./cited";

/**
 * Refuses to sign a run "performed" while an instrument it cites is past its calibration due date
 * (or a test-ink set past its expiry), saying which and since when.
 */
export async function assertCitedInstrumentsCalibrated(
  db: Executor,
  runId: string,
  now = new Date(),
) {
  const problem = calibrationSigningProblem(await citedInstruments(db, runId), todayUtc(now));
  if (problem) throw new UserFacingError(problem, { kind: "conflict" });
}
