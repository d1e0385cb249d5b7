import "server-only";
import type { Tx } from "@/db/client";
import type { TestRun } from "@/db/schema";
import { todayUtc } from "@/lib/format/date";
import { UserFacingError } from "@/lib/server/errors";
import { trainingProblemsForRun } from "@/lib/server/training/state";

/**
 * What must hold of the people and means behind a run before its technician signs it
 * "performed", checked in the signing transaction: current training on every lab method the run
 * cites. Each check names what is missing in plain words; nothing is signed while one fails.
 */
export async function assertReadyToPerform(
  tx: Tx,
  run: TestRun,
  signer: { id: string },
  now = new Date(),
) {
  const training = await trainingProblemsForRun(tx, run.id, signer.id, todayUtc(now));
  if (training.length > 0) throw new UserFacingError(training.join(" "), { kind: "forbidden" });
}
