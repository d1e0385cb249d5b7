import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { evidenceFiles, nonconformanceFiles, nonconformanceItems, recipes } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { UserFacingError } from "@/lib/server/errors";
import { assertWorkable, loadNc } from "./shared";

export interface DispositionInput {
  nonconformanceId: string;
  itemId: string;
  disposition: "reclean" | "use_as_is" | "scrap";
  recleanRecipeId?: string | null;
  concessionReference?: string | null;
  concessionFileId?: string | null;
  note?: string | null;
}

/**
 * What happens to a held item: washed again under a named recipe and retested, used as is
 * under the customer's written concession (reference and letter), or scrapped.
 */
export async function setDispositionIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  input: DispositionInput,
  now = new Date(),
) {
  const nc = await loadNc(tx, input.nonconformanceId);
  assertWorkable(nc);
  const [item] = await tx
    .select()
    .from(nonconformanceItems)
    .where(
      and(
        eq(nonconformanceItems.id, input.itemId),
        eq(nonconformanceItems.nonconformanceId, nc.id),
      ),
    );
  if (!item)
    throw new UserFacingError("That item is not in this containment.", { kind: "not_found" });
  if (item.hold !== "held")
    throw new UserFacingError(`Hold ${item.label} before recording what happens to it.`);

  let recipeCode: string | null = null;
  let fileSha: string | null = null;
  if (input.disposition === "reclean") {
    if (!input.recleanRecipeId)
      throw new UserFacingError("Name the recipe the items are cleaned again under.", {
        kind: "invalid",
        field: "recleanRecipeId",
      });
    const [recipe] = await tx.select().from(recipes).where(eq(recipes.id, input.recleanRecipeId));
    if (!recipe)
      throw new UserFacingError("That recipe does not exist.", {
        kind: "invalid",
        field: "recleanRecipeId",
      });
    recipeCode = recipe.code;
  }
  if (input.disposition === "use_as_is") {
    if (!input.concessionReference?.trim())
      throw new UserFacingError("Enter the customer's concession reference.", {
        kind: "invalid",
        field: "concessionReference",
      });
    if (!input.concessionFileId)
      throw new UserFacingError(
        "Choose the customer's concession letter (upload it to this nonconformance first).",
        { kind: "invalid", field: "concessionFileId" },
      );
    const [file] = await tx
      .select({ sha256: evidenceFiles.sha256 })
      .from(nonconformanceFiles)
      .innerJoin(evidenceFiles, eq(evidenceFiles.id, nonconformanceFiles.fileId))
      .where(
        and(
          eq(nonconformanceFiles.nonconformanceId, nc.id),
          eq(nonconformanceFiles.fileId, input.concessionFileId),
        ),
      );
    if (!file)
      throw new UserFacingError("That letter is not uploaded to this nonconformance.", {
        kind: "invalid",
        field: "concessionFileId",
      });
    fileSha = file.sha256;
  }
  const values = {
    disposition: input.disposition,
    recleanRecipeId: input.disposition === "reclean" ? input.recleanRecipeId! : null,
    concessionReference:
      input.disposition === "use_as_is" ? input.concessionReference!.trim() : null,
    concessionFileId: input.disposition === "use_as_is" ? input.concessionFileId! : null,
    dispositionNote: input.note || null,
    dispositionBy: actor.id,
    dispositionAt: now.toISOString(),
  };
  await tx.update(nonconformanceItems).set(values).where(eq(nonconformanceItems.id, item.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "nonconformance.item_disposed",
      recordType: "nonconformance",
      recordId: nc.id,
      old: { item: item.label, disposition: item.disposition },
      new: {
        item: item.label,
        disposition: input.disposition,
        recleanRecipe: recipeCode,
        concessionReference: values.concessionReference,
        concessionFile: fileSha,
        note: values.dispositionNote,
      },
    },
    now,
  );
}

export const setDisposition = (actor: AuditActor & { id: string }, input: DispositionInput) =>
  getDb().transaction((tx) => setDispositionIn(tx, actor, input));
