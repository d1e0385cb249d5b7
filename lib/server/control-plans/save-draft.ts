import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { controlPlanLines } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import type { SaveControlPlanDraftInput } from "@/lib/schemas/control-plan";
import { UserFacingError } from "@/lib/server/errors";
import { assertLinesFit, insertLines } from "./lines";
import { controlPlanContentHash, loadControlPlanOfVersion } from "./state";

/** Replaces the lines of a draft version; a version sent for review changes only after it is sent back. */
export async function saveControlPlanDraft(
  actor: { id: string; name: string },
  input: SaveControlPlanDraftInput,
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const { view, version } = await loadControlPlanOfVersion(tx, input.versionId);
    if (version.status !== "draft")
      throw new UserFacingError(
        "This version is no longer a draft: it changes only through a new version.",
        { kind: "conflict" },
      );
    await assertLinesFit(tx, view.combination.systemId, input.lines);
    await tx.delete(controlPlanLines).where(eq(controlPlanLines.versionId, version.id));
    const lines = await insertLines(tx, version.id, input.lines);
    await appendAudit(
      tx,
      actor,
      {
        eventType: "control_plan.draft_saved",
        recordType: "control_plan_version",
        recordId: version.id,
        old: { lines: version.lines.length, contentHash: version.contentHash },
        new: {
          lines: lines.length,
          contentHash: controlPlanContentHash(view.plan, version.version, lines),
        },
      },
      now,
    );
  });
}
