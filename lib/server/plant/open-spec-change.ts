import "server-only";
import { and, asc, eq, inArray } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import {
  changeRequests,
  changeRequestSpecs,
  cleanlinessSpecs,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
} from "@/db/schema";
import type { AuditActor } from "@/lib/audit";
import { compareSpecRevisions, type SpecComparison } from "@/lib/specs/compare";
import { openChangeRequestIn } from "@/lib/server/changes/open-change-request";
import { UserFacingError } from "@/lib/server/errors";

export interface SpecChangeCandidate {
  recipeId: string;
  code: string;
  version: number;
  /** The change request already opened for this revision on the recipe, if any. */
  changeRequest: { id: string; number: string } | null;
}

/**
 * A revision in force that superseded another, compared with it, and the recipes whose effective
 * version is qualified for a part family on it: each needs a change request of kind
 * "specification", because its validation was proven against the old limits.
 */
export async function specChangeCandidates(
  specId: string,
  db: Executor = getDb(),
): Promise<{ comparison: SpecComparison; recipes: SpecChangeCandidate[] } | null> {
  const [spec] = await db.select().from(cleanlinessSpecs).where(eq(cleanlinessSpecs.id, specId));
  if (!spec?.supersedesId || spec.status !== "in_force") return null;
  const [old] = await db
    .select()
    .from(cleanlinessSpecs)
    .where(eq(cleanlinessSpecs.id, spec.supersedesId));
  if (!old) return null;
  const comparison = compareSpecRevisions(old, spec);
  const rows = await db
    .selectDistinct({ recipeId: recipes.id, code: recipes.code, version: recipeVersions.version })
    .from(requalificationIntervals)
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(and(eq(partFamilies.specId, spec.id), eq(recipeVersions.status, "effective")))
    .orderBy(asc(recipes.code));
  const opened = rows.length
    ? await db
        .select({
          id: changeRequests.id,
          number: changeRequests.number,
          recipeId: changeRequests.recipeId,
        })
        .from(changeRequestSpecs)
        .innerJoin(changeRequests, eq(changeRequests.id, changeRequestSpecs.changeRequestId))
        .where(
          and(
            eq(changeRequestSpecs.toSpecId, spec.id),
            inArray(
              changeRequests.recipeId,
              rows.map((r) => r.recipeId),
            ),
          ),
        )
    : [];
  return {
    comparison,
    recipes: rows.map((r) => {
      const cr = opened.find((o) => o.recipeId === r.recipeId);
      return { ...r, changeRequest: cr ? { id: cr.id, number: cr.number } : null };
    }),
  };
}

/**
 * Opens the change request of kind "specification" a revised specification calls for on one
 * recipe qualified to it. The proposal starts as the effective version unchanged (the recipe may
 * already meet the new limit); the assessment compares the two revisions: tightening is major
 * and calls for the tests that prove the tightened limits, loosening is minor and needs approval.
 */
export async function openSpecificationChange(
  actor: AuditActor & { id: string },
  input: { specId: string; recipeId: string },
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const candidates = await specChangeCandidates(input.specId, tx);
    if (!candidates)
      throw new UserFacingError(
        "Only a revision in force that superseded another opens a specification change.",
        { kind: "invalid" },
      );
    if (!candidates.comparison.changes.length)
      throw new UserFacingError("This revision changes no limit: there is nothing to assess.", {
        kind: "invalid",
      });
    const target = candidates.recipes.find((r) => r.recipeId === input.recipeId);
    if (!target)
      throw new UserFacingError(
        "That recipe is not qualified for a part family on this specification.",
        { kind: "invalid" },
      );
    if (target.changeRequest)
      throw new UserFacingError(
        `Change request ${target.changeRequest.number} is already open for this revision on ${target.code}.`,
        { kind: "conflict" },
      );
    const [spec] = await tx
      .select()
      .from(cleanlinessSpecs)
      .where(eq(cleanlinessSpecs.id, input.specId));
    const [old] = await tx
      .select({ revision: cleanlinessSpecs.revision })
      .from(cleanlinessSpecs)
      .where(eq(cleanlinessSpecs.id, spec.supersedesId!));
    const cr = await openChangeRequestIn(
      tx,
      actor,
      {
        recipeId: target.recipeId,
        kind: "specification",
        title:
          `${spec.code} revised ${old.revision} → ${spec.revision}: ${candidates.comparison.tightens ? "tightened" : "changed"} limits on ${target.code}`.slice(
            0,
            200,
          ),
      },
      now,
    );
    await tx.insert(changeRequestSpecs).values({
      changeRequestId: cr.id,
      fromSpecId: spec.supersedesId!,
      toSpecId: spec.id,
      createdAt: now.toISOString(),
    });
    return cr;
  });
}
