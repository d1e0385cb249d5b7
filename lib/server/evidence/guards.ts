import "server-only";
import type { Executor } from "@/db/client";
import { UserFacingError } from "@/lib/server/errors";
import { getRunRow } from "./run-content";

/** Raw data may change only while a run is open; performed and verified runs are corrected by a new revision. */
export async function requireOpenRun(db: Executor, runId: string) {
  const run = await getRunRow(db, runId);
  if (!run) throw new UserFacingError("This test run does not exist.", { kind: "not_found" });
  if (run.status !== "open") {
    throw new UserFacingError(
      run.status === "superseded"
        ? "This revision has been superseded; open the current revision."
        : `This run is ${run.status} and locked. To correct it, make a new revision with a reason.`,
      { kind: "locked" },
    );
  }
  return run;
}
