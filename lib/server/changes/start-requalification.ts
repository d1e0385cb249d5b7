import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { changeRequests } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { assertStep } from "./guard";
import { notifyNext } from "./notify";
import { loadChangeState } from "./state";

/** The approved change is implemented on the proposed version and its tests are handed to the lab. */
export async function startRequalification(
  actor: AuditActor,
  input: { changeRequestId: string },
  now = new Date(),
) {
  await getDb().transaction(async (tx) => {
    const state = await loadChangeState(tx, input.changeRequestId);
    assertStep(state, "start_requalification");
    await tx
      .update(changeRequests)
      .set({ status: "requalification" })
      .where(eq(changeRequests.id, state.cr.id));
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.requalification_started",
        recordType: "change_request",
        recordId: state.cr.id,
        old: { status: state.cr.status },
        new: { status: "requalification" },
      },
      now,
    );
    const list = state.requirements
      .map((r) => `${TEST_TYPE_LABELS[r.testType]} on ${r.samples} parts`)
      .join("; ");
    await notifyNext(tx, {
      cr: state.cr,
      status: "requalification",
      actorName: actor.name,
      nextStep: `run the requalification tests on ${state.recipe.code} version ${state.toVersion.version}: ${list}.`,
      roles: ["technician"],
    });
  });
}
