import "server-only";
import { and, eq, notInArray, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  changeRequestAssessments,
  changeRequests,
  documents,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  testRuns,
  userRoles,
} from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { runCombinationRefusal } from "@/lib/plant/combination";
import type { CreateRun } from "@/lib/schemas/evidence";
import { addsPartFamily } from "@/lib/changes/workflow";
import { UserFacingError } from "@/lib/server/errors";

/** Opens a test run with its context; samples are added afterwards. */
export async function createRun(
  actor: { id: string; name: string } & AuditActor,
  input: CreateRun,
) {
  return getDb().transaction(async (tx) => {
    const [family] = await tx
      .select()
      .from(partFamilies)
      .where(eq(partFamilies.id, input.partFamilyId));
    if (!family)
      throw new UserFacingError("Choose a part family from the list.", {
        kind: "invalid",
        field: "partFamilyId",
      });
    const [version] = await tx
      .select()
      .from(recipeVersions)
      .where(eq(recipeVersions.id, input.recipeVersionId));
    if (!version)
      throw new UserFacingError("Choose a recipe version from the list.", {
        kind: "invalid",
        field: "recipeVersionId",
      });
    const qualifiedOn = async (versionId: string | null) =>
      versionId !== null &&
      (
        await tx
          .select({ id: requalificationIntervals.id })
          .from(requalificationIntervals)
          .where(
            and(
              eq(requalificationIntervals.recipeVersionId, versionId),
              eq(requalificationIntervals.partFamilyId, family.id),
            ),
          )
      ).length > 0;
    let requalifiesIt = false;
    if (input.changeRequestId) {
      // A run tied to a change request counts in its gate, so it must test the version the change proposes.
      const [cr] = await tx
        .select()
        .from(changeRequests)
        .where(eq(changeRequests.id, input.changeRequestId));
      if (!cr || !["approved_for_implementation", "requalification"].includes(cr.status))
        throw new UserFacingError(
          "Choose a change request that is waiting for requalification evidence.",
          { kind: "invalid", field: "changeRequestId" },
        );
      if (cr.toVersionId !== version.id) {
        const [proposed] = await tx
          .select({ code: recipes.code, version: recipeVersions.version })
          .from(recipeVersions)
          .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
          .where(eq(recipeVersions.id, cr.toVersionId!));
        throw new UserFacingError(
          `${cr.number} is requalified on ${proposed ? `${proposed.code} v${proposed.version}` : "its proposed version"}: choose that recipe version, or no change request.`,
          "changeRequestId",
        );
      }
      const [assessment] = await tx
        .select()
        .from(changeRequestAssessments)
        .where(eq(changeRequestAssessments.changeRequestId, cr.id));
      requalifiesIt =
        (!!assessment &&
          addsPartFamily(assessment.kind) &&
          assessment.partFamilyId === family.id) ||
        (await qualifiedOn(cr.fromVersionId));
    }
    if (!input.changeRequestId && version.status === "proposed") {
      // Evidence gathered on a proposal before it is linked to its change request still requalifies that change's families.
      const open = await tx
        .select({
          fromVersionId: changeRequests.fromVersionId,
          kind: changeRequestAssessments.kind,
          addsFamily: changeRequestAssessments.partFamilyId,
        })
        .from(changeRequests)
        .leftJoin(
          changeRequestAssessments,
          eq(changeRequestAssessments.changeRequestId, changeRequests.id),
        )
        .where(
          and(
            eq(changeRequests.toVersionId, version.id),
            notInArray(changeRequests.status, ["closed", "rejected", "withdrawn"]),
          ),
        );
      for (const cr of open)
        if (
          (!!cr.kind && addsPartFamily(cr.kind) && cr.addsFamily === family.id) ||
          (await qualifiedOn(cr.fromVersionId))
        )
          requalifiesIt = true;
    }
    let protocolForIt = false;
    if (input.protocolDocumentId) {
      const [doc] = await tx
        .select()
        .from(documents)
        .where(eq(documents.id, input.protocolDocumentId));
      protocolForIt =
        !!doc &&
        doc.partFamilyId === family.id &&
        doc.recipeVersionId === version.id &&
        ["iq_protocol", "oq_protocol", "pq_protocol"].includes(doc.type);
    }
    const [recipe] = await tx
      .select({ code: recipes.code })
      .from(recipes)
      .where(eq(recipes.id, version.recipeId));
    const refusal = runCombinationRefusal({
      familyCode: family.code,
      recipeCode: recipe.code,
      version: version.version,
      qualified: await qualifiedOn(version.id),
      requalifiesIt,
      protocolForIt,
    });
    if (refusal) throw new UserFacingError(refusal, "recipeVersionId");
    const [tech] = await tx
      .select()
      .from(userRoles)
      .where(and(eq(userRoles.userId, input.technicianId), eq(userRoles.role, "technician")));
    if (!tech)
      throw new UserFacingError("Choose a technician from the list.", {
        kind: "invalid",
        field: "technicianId",
      });
    const [{ n }] = await tx
      .select({ n: sql<number>`count(distinct ${testRuns.number})` })
      .from(testRuns);
    const number = `TR-${String(Number(n) + 1).padStart(4, "0")}`;
    const [run] = await tx
      .insert(testRuns)
      .values({
        number,
        partFamilyId: input.partFamilyId,
        recipeVersionId: input.recipeVersionId,
        // Judged by the specification revision in force today, whatever revisions follow.
        specId: family.specId,
        testType: input.testType,
        technicianId: input.technicianId,
        lab: input.lab,
        performedOn: input.performedOn,
        protocolDocumentId: input.protocolDocumentId ?? null,
        changeRequestId: input.changeRequestId ?? null,
        requirement: input.requirement ?? null,
        outcome: "incomplete",
        createdBy: actor.id,
      })
      .returning();
    await appendAudit(tx, actor, {
      eventType: "test_run.created",
      recordType: "test_run",
      recordId: run.id,
      new: { number, ...input },
    });
    return run;
  });
}
