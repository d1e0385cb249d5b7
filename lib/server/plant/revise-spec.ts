import "server-only";
import { and, eq, inArray, notInArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  cleanlinessSpecs,
  partFamilies,
  requalificationIntervals,
  recipes,
  recipeVersions,
} from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { ReviseSpecInput } from "@/lib/schemas/spec";
import { UserFacingError } from "@/lib/server/errors";
import { compareSpecRevisions, type SpecComparison } from "@/lib/specs/compare";
import { applySpecToFamilies, checkSourceFile, specRecord, specValues } from "./create-spec";

export interface SpecRevision {
  specId: string;
  comparison: SpecComparison;
  /** When the revision tightens a limit: the families it governs and the recipe versions qualified for them. */
  affected: {
    partFamilies: { id: string; code: string; name: string }[];
    recipes: { recipeVersionId: string; code: string; version: number; status: string }[];
  };
}

/**
 * A new revision supersedes the one in force. Every part family on the old revision moves to the
 * new one (and any family named besides); runs keep the revision they were opened under. When a
 * limit tightens, the families and the recipe versions qualified for them are returned, because
 * their validation was proven against the looser limit.
 */
export async function reviseSpec(actor: AuditActor, input: ReviseSpecInput): Promise<SpecRevision> {
  return getDb().transaction(async (tx) => {
    const [old] = await tx
      .select()
      .from(cleanlinessSpecs)
      .where(eq(cleanlinessSpecs.id, input.specId));
    if (!old) throw new UserFacingError("That specification does not exist.");
    if (old.status !== "in_force")
      throw new UserFacingError(
        `${old.code} revision ${old.revision} is already superseded: revise the revision in force.`,
      );
    const [clash] = await tx
      .select()
      .from(cleanlinessSpecs)
      .where(
        and(eq(cleanlinessSpecs.code, old.code), eq(cleanlinessSpecs.revision, input.revision)),
      );
    if (clash)
      throw new UserFacingError(
        `${old.code} already has a revision ${input.revision}: name the new revision.`,
        "revision",
      );
    await checkSourceFile(tx, input.sourceFileId);
    const { specId, reason, partFamilyIds, ...limits } = input;

    const now = new Date().toISOString();
    const [spec] = await tx
      .insert(cleanlinessSpecs)
      .values({ ...specValues(old.code, limits), supersedesId: old.id })
      .returning();
    await tx
      .update(cleanlinessSpecs)
      .set({ status: "superseded", supersededAt: now })
      .where(eq(cleanlinessSpecs.id, specId));
    const comparison = compareSpecRevisions(old, spec);
    await appendAudit(tx, actor, {
      eventType: "cleanliness_spec.revised",
      recordType: "cleanliness_spec",
      recordId: spec.id,
      old: specRecord(old),
      new: specRecord({ ...limits, code: old.code, ccc: spec.ccc }),
      reason,
    });
    await appendAudit(tx, actor, {
      eventType: "cleanliness_spec.superseded",
      recordType: "cleanliness_spec",
      recordId: old.id,
      old: { status: "in_force" },
      new: { status: "superseded", by: `${spec.code} rev ${spec.revision}` },
      reason,
    });

    const onOld = await tx
      .select({ id: partFamilies.id })
      .from(partFamilies)
      .where(eq(partFamilies.specId, old.id));
    const familyIds = [...new Set([...onOld.map((f) => f.id), ...partFamilyIds])];
    await applySpecToFamilies(
      tx,
      actor,
      spec,
      familyIds,
      `${old.code} revised to rev ${spec.revision}: ${reason}`,
    );

    const affected: SpecRevision["affected"] = { partFamilies: [], recipes: [] };
    if (comparison.tightens && familyIds.length) {
      affected.partFamilies = await tx
        .select({ id: partFamilies.id, code: partFamilies.code, name: partFamilies.name })
        .from(partFamilies)
        .where(inArray(partFamilies.id, familyIds))
        .orderBy(partFamilies.code);
      const rows = await tx
        .selectDistinct({
          recipeVersionId: recipeVersions.id,
          code: recipes.code,
          version: recipeVersions.version,
          status: recipeVersions.status,
        })
        .from(requalificationIntervals)
        .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
        .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
        .where(
          and(
            inArray(requalificationIntervals.partFamilyId, familyIds),
            notInArray(recipeVersions.status, ["superseded", "withdrawn"]),
          ),
        )
        .orderBy(recipes.code, recipeVersions.version);
      affected.recipes = rows;
    }
    return { specId: spec.id, comparison, affected };
  });
}
