import "server-only";
import { and, eq, inArray, like } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  changeRequestAssessments,
  changeRequests,
  documents,
  documentVersions,
  partFamilies,
  recipes,
  recipeVersions,
} from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { narrativeDocument } from "@/lib/changes/content";
import { OPEN_STATUSES } from "@/lib/changes/workflow";
import type { OpenInitialValidation } from "@/lib/schemas/change";
import { UserFacingError } from "@/lib/server/errors";

/**
 * Routes a new recipe's draft first version through its initial validation: a change request of
 * kind "initial_validation" whose proposal is the draft itself and whose "from" is none. From here
 * it follows change control (assessed, approved, requalification evidence, verified, closed by a
 * second person), and closing makes the version effective and qualifies it for the part family.
 */
export async function openInitialValidation(
  actor: AuditActor & { id: string },
  input: OpenInitialValidation,
  now = new Date(),
) {
  return getDb().transaction(async (tx) => {
    const [recipe] = await tx.select().from(recipes).where(eq(recipes.id, input.recipeId));
    if (!recipe) throw new UserFacingError("That recipe does not exist.", { kind: "not_found" });
    const versions = await tx
      .select()
      .from(recipeVersions)
      .where(eq(recipeVersions.recipeId, recipe.id));
    if (versions.some((v) => v.status === "effective" || v.status === "superseded")) {
      throw new UserFacingError(
        `${recipe.code} has been validated already: change it through a change request.`,
        { kind: "conflict" },
      );
    }
    const [open] = await tx
      .select()
      .from(changeRequests)
      .where(
        and(eq(changeRequests.recipeId, recipe.id), inArray(changeRequests.status, OPEN_STATUSES)),
      );
    if (open)
      throw new UserFacingError(
        `${open.number} is already open on this recipe: finish or withdraw it first.`,
        { kind: "conflict" },
      );
    const draft = versions.find((v) => v.status === "draft");
    if (!draft)
      throw new UserFacingError(`${recipe.code} has no draft version to validate.`, {
        kind: "conflict",
      });
    const [family] = await tx
      .select()
      .from(partFamilies)
      .where(eq(partFamilies.id, input.partFamilyId));
    if (!family)
      throw new UserFacingError("Choose the part family from the list.", {
        kind: "invalid",
        field: "partFamilyId",
      });

    const year = now.getUTCFullYear();
    const sameYear = await tx
      .select({ id: changeRequests.id })
      .from(changeRequests)
      .where(like(changeRequests.number, `CR-${year}-%`));
    const number = `CR-${year}-${String(sameYear.length + 1).padStart(3, "0")}`;
    const [doc] = await tx
      .insert(documents)
      .values({
        number: `CN-${number.slice(3)}`,
        title: `Validation rationale and risk assessment, ${number}`,
        type: "change_narrative",
        recipeVersionId: draft.id,
        ownerId: actor.id,
      })
      .returning();
    await tx.insert(documentVersions).values({
      documentId: doc.id,
      version: 1,
      content: narrativeDocument(""),
      createdBy: actor.id,
    });
    const [cr] = await tx
      .insert(changeRequests)
      .values({
        number,
        title: input.title,
        recipeId: recipe.id,
        fromVersionId: null,
        toVersionId: draft.id,
        narrativeDocumentId: doc.id,
        createdBy: actor.id,
        createdAt: now.toISOString(),
      })
      .returning();
    await tx.insert(changeRequestAssessments).values({
      changeRequestId: cr.id,
      kind: "initial_validation",
      partFamilyId: family.id,
      updatedAt: now.toISOString(),
    });
    // Proposed while under validation: runs on it open for this family, and it is edited only through the request.
    await tx
      .update(recipeVersions)
      .set({ status: "proposed" })
      .where(eq(recipeVersions.id, draft.id));

    await appendAudit(
      tx,
      actor,
      {
        eventType: "recipe_version.validation_opened",
        recordType: "recipe_version",
        recordId: draft.id,
        old: { status: "draft" },
        new: { status: "proposed", changeRequest: number, partFamily: family.code },
      },
      now,
    );
    await appendAudit(
      tx,
      actor,
      {
        eventType: "change.opened",
        recordType: "change_request",
        recordId: cr.id,
        new: {
          number,
          title: input.title,
          kind: "initial_validation",
          recipe: recipe.code,
          fromVersion: null,
          toVersion: draft.version,
          narrativeDocument: doc.number,
        },
      },
      now,
    );
    return cr;
  });
}
