import "server-only";
import { and, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  documentReviews,
  documentRoundTexts,
  documentVersions,
  signatures,
  userRoles,
  users,
  type RoutingMode,
} from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { applySignature } from "@/lib/server/signatures/apply-signature";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import {
  activateNextStep,
  assertTransition,
  hashContent,
  loadVersion,
  type DocumentActor,
} from "./shared";
import { todayUtc } from "@/lib/format/date";

export interface SubmitForReview {
  versionId: string;
  lockVersion: number;
  contentHash: string;
  reviewerIds: string[];
  approverId: string;
  routing: RoutingMode;
  dueDate: string | null;
  password: string;
}

/** Holders of a role who are active, among the given ids. */
async function activeHolders(ids: string[], role: "reviewer" | "approver") {
  const rows = await getDb()
    .select({ id: users.id })
    .from(users)
    .innerJoin(userRoles, and(eq(userRoles.userId, users.id), eq(userRoles.role, role)))
    .where(and(inArray(users.id, ids), eq(users.active, true)));
  return new Set(rows.map((r) => r.id));
}

/**
 * Freezes the draft (content hash), signs it "authored" with the author's
 * password, and routes it: reviewers one after another or all at once, then
 * the approver. The first step's people are e-mailed after commit.
 */
export async function submitForReview(
  actor: DocumentActor,
  input: SubmitForReview,
  now = new Date(),
) {
  if (input.reviewerIds.includes(actor.id) || input.approverId === actor.id) {
    throw new UserFacingError(
      "The author cannot review or approve their own document: choose other people.",
      { kind: "invalid", field: "reviewerIds" },
    );
  }
  const reviewers = await activeHolders(input.reviewerIds, "reviewer");
  const missing = input.reviewerIds.filter((id) => !reviewers.has(id));
  if (missing.length)
    throw new UserFacingError("Every reviewer must be an active user with the reviewer role.", {
      kind: "invalid",
      field: "reviewerIds",
    });
  if (!(await activeHolders([input.approverId], "approver")).has(input.approverId)) {
    throw new UserFacingError("The approver must be an active user with the approver role.", {
      kind: "invalid",
      field: "approverId",
    });
  }
  if (input.dueDate && input.dueDate < todayUtc(now))
    throw new UserFacingError("The due date cannot be in the past.", {
      kind: "invalid",
      field: "dueDate",
    });
  const signer = await verifySigner({ userId: actor.id, password: input.password }, now);

  return getDb().transaction(async (tx) => {
    const { version, document } = await loadVersion(tx, input.versionId);
    assertTransition(version, "submit", actor, document.type);
    if (version.lockVersion !== input.lockVersion) {
      throw new UserFacingError(
        "The draft was saved again after you opened this page. Reload to submit the latest text.",
      );
    }
    const contentHash = hashContent(version.content);
    if (contentHash !== input.contentHash)
      throw new UserFacingError(
        "The draft changed since you opened this page. Nothing was signed; reload to submit the latest text.",
      );
    const [again] = await tx
      .select({ id: signatures.id })
      .from(signatures)
      .where(
        and(
          eq(signatures.recordType, "document_version"),
          eq(signatures.recordId, version.id),
          eq(signatures.contentHash, contentHash),
        ),
      );
    if (again)
      throw new UserFacingError(
        "This exact text was submitted before and returned. Change the draft to answer the comments, then submit again.",
      );

    const round = version.reviewRound + 1;
    const submittedAt = now.toISOString();
    await tx
      .update(documentVersions)
      .set({
        status: "in_review",
        contentHash,
        submittedAt,
        reviewRound: round,
        routing: input.routing,
        lockVersion: version.lockVersion + 1,
      })
      .where(eq(documentVersions.id, version.id));
    // Kept per round, so the next round's reviewers see what changed since they sent it back.
    await tx.insert(documentRoundTexts).values({
      versionId: version.id,
      round,
      contentHash,
      content: version.content,
      createdAt: submittedAt,
    });
    const dueAt = input.dueDate ? `${input.dueDate}T23:59:59.999Z` : null;
    const steps = [
      ...input.reviewerIds.map((assigneeId, i) => ({
        assigneeId,
        role: "reviewer" as const,
        step: input.routing === "sequence" ? i + 1 : 1,
      })),
      {
        assigneeId: input.approverId,
        role: "approver" as const,
        step: input.routing === "sequence" ? input.reviewerIds.length + 1 : 2,
      },
    ];
    await tx
      .insert(documentReviews)
      .values(steps.map((s) => ({ ...s, versionId: version.id, round, dueAt })));
    await applySignature(
      tx,
      {
        signer,
        recordType: "document_version",
        recordId: version.id,
        meaning: "authored",
        contentHash,
      },
      now,
    );
    const updated = { ...version, reviewRound: round };
    await activateNextStep(tx, updated, document, actor.name, now);
    await appendAudit(
      tx,
      actor,
      {
        eventType: "document.submitted",
        recordType: "document_version",
        recordId: version.id,
        old: { status: version.status },
        new: {
          status: "in_review",
          number: document.number,
          version: version.version,
          contentHash,
          round,
          routing: input.routing,
          reviewers: input.reviewerIds,
          approver: input.approverId,
          due: dueAt,
        },
      },
      now,
    );
    return { contentHash, round };
  });
}
