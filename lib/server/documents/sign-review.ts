import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { documentReviews, users } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import {
  activateNextStep,
  assertTransition,
  findMyActiveStep,
  loadVersion,
  type DocumentActor,
} from "./shared";

/** A reviewer signs "reviewed" on exactly the hash they were shown; the next step opens when its turn comes. */
export async function signReview(
  actor: DocumentActor,
  input: { versionId: string; contentHash: string; password: string },
  now = new Date(),
) {
  const signer = await verifySigner({ userId: actor.id, password: input.password }, now);
  return getDb().transaction(async (tx) => {
    const { version, document } = await loadVersion(tx, input.versionId);
    assertTransition(version, "review", actor, document.type);
    const step = await findMyActiveStep(tx, version, actor.id, "reviewer");
    if (version.contentHash !== input.contentHash)
      throw new UserFacingError(
        "This version changed since you opened it. Nothing was signed; reload and review again.",
      );
    await applySignature(
      tx,
      {
        signer,
        recordType: "document_version",
        recordId: version.id,
        meaning: "reviewed",
        contentHash: input.contentHash,
      },
      now,
    );
    await tx
      .update(documentReviews)
      .set({ decision: "reviewed", decidedAt: now.toISOString() })
      .where(eq(documentReviews.id, step.id));
    const [owner] = await tx
      .select({ name: users.name })
      .from(users)
      .where(eq(users.id, document.ownerId));
    const opened = await activateNextStep(tx, version, document, owner?.name ?? "The author", now);
    await appendAudit(
      tx,
      actor,
      {
        eventType: "document.reviewed",
        recordType: "document_version",
        recordId: version.id,
        new: {
          step: step.step,
          round: step.round,
          contentHash: input.contentHash,
          nextStep: opened,
        },
      },
      now,
    );
  });
}
