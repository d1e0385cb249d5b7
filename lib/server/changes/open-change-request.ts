import "server-only";
import { and, desc, eq, inArray, like } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import {
  changeRequestAssessments,
  changeRequests,
  documents,
  documentVersions,
  recipes,
  recipeVersions,
} from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { OPEN_STATUSES, type ChangeKind } from "@/lib/changes/workflow";
import { UserFacingError } from "@/lib/server/errors";
import { narrativeDocument } from "@/lib/changes/content";
import { loadRecipeSnapshot, writeRecipeContent } from "./snapshot";

/**
 * Opens a change request against a recipe's effective version: the proposal
 * starts as a copy of that version, and the justification as an empty
 * change-narrative document. One open change per recipe, so proposals never race.
 */
export async function openChangeRequest(
  actor: AuditActor & { id: string },
  input: { recipeId: string; title: string; kind: ChangeKind },
  now = new Date(),
  /** The caller's transaction, when the change opens with another record (a nonconformance's action). */
  outer?: Tx,
) {
  return inTransaction(outer, async (tx) => {
    const [recipe] = await tx.select().from(recipes).where(eq(recipes.id, input.recipeId));
    if (!recipe) throw new UserFacingError("That recipe does not exist.", { kind: "not_found" });
    const [effective] = await tx
      .select()
      .from(recipeVersions)
      .where(and(eq(recipeVersions.recipeId, recipe.id), eq(recipeVersions.status, "effective")));
    if (!effective) throw new UserFacingError("This recipe has no effective version to change.");
    const [open] = await tx
      .select()
      .from(changeRequests)
      .where(
        and(eq(changeRequests.recipeId, recipe.id), inArray(changeRequests.status, OPEN_STATUSES)),
      );
    if (open)
      throw new UserFacingError(
        `Change request ${open.number} is already open on this recipe: finish or withdraw it first.`,
      );

    const [latest] = await tx
      .select()
      .from(recipeVersions)
      .where(eq(recipeVersions.recipeId, recipe.id))
      .orderBy(desc(recipeVersions.version))
      .limit(1);
    const [proposed] = await tx
      .insert(recipeVersions)
      .values({
        recipeId: recipe.id,
        version: latest.version + 1,
        status: "proposed",
        createdBy: actor.id,
        createdAt: now.toISOString(),
      })
      .returning();
    await writeRecipeContent(tx, proposed.id, await loadRecipeSnapshot(tx, effective.id));

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
        title: `Justification and risk assessment, ${number}`,
        type: "change_narrative",
        recipeVersionId: proposed.id,
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
        fromVersionId: effective.id,
        toVersionId: proposed.id,
        narrativeDocumentId: doc.id,
        createdBy: actor.id,
        createdAt: now.toISOString(),
      })
      .returning();
    await tx
      .insert(changeRequestAssessments)
      .values({ changeRequestId: cr.id, kind: input.kind, updatedAt: now.toISOString() });

    await appendAudit(
      tx,
      actor,
      {
        eventType: "recipe_version.proposed",
        recordType: "recipe_version",
        recordId: proposed.id,
        new: {
          recipe: recipe.code,
          version: proposed.version,
          copiedFrom: effective.version,
          changeRequest: number,
        },
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
          kind: input.kind,
          recipe: recipe.code,
          fromVersion: effective.version,
          toVersion: proposed.version,
          narrativeDocument: doc.number,
        },
      },
      now,
    );
    return cr;
  });
}

function inTransaction<T>(outer: Tx | undefined, work: (tx: Tx) => Promise<T>): Promise<T> {
  return outer ? work(outer) : getDb().transaction(work);
}
