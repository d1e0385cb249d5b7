import "server-only";
import { count, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { cleanlinessSpecs, partFamilies, requalificationIntervals, testRuns } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { UpdatePartFamilyInput } from "@/lib/schemas/part-family";
import { UserFacingError } from "@/lib/server/errors";
import { checkFamilyClashes, familyRecord, specInForce } from "./create-part-family";

/**
 * Edits a part family. Once runs were opened on it or a recipe is qualified for it, the family
 * is in use: the edit needs a reason, because evidence already refers to what it says.
 */
export async function updatePartFamily(actor: AuditActor, input: UpdatePartFamilyInput) {
  return getDb().transaction(async (tx) => {
    const [family] = await tx
      .select()
      .from(partFamilies)
      .where(eq(partFamilies.id, input.partFamilyId));
    if (!family) throw new UserFacingError("That part family does not exist.");
    await checkFamilyClashes(tx, input, family.id);
    const [oldSpec] = await tx
      .select()
      .from(cleanlinessSpecs)
      .where(eq(cleanlinessSpecs.id, family.specId));
    const spec = input.specId === family.specId ? oldSpec : await specInForce(tx, input.specId);
    const [{ runs }] = await tx
      .select({ runs: count() })
      .from(testRuns)
      .where(eq(testRuns.partFamilyId, family.id));
    const [{ combos }] = await tx
      .select({ combos: count() })
      .from(requalificationIntervals)
      .where(eq(requalificationIntervals.partFamilyId, family.id));
    if ((runs > 0 || combos > 0) && !input.reason) {
      throw new UserFacingError(
        `${family.code} is in use (${runs} test run${runs === 1 ? "" : "s"}, ${combos} qualified recipe${combos === 1 ? "" : "s"}): give the reason for the change.`,
        "reason",
      );
    }
    const { partFamilyId, reason, ...fields } = input;
    const [row] = await tx
      .update(partFamilies)
      .set({ ...fields, updatedAt: new Date().toISOString() })
      .where(eq(partFamilies.id, partFamilyId))
      .returning();
    await appendAudit(tx, actor, {
      eventType: "part_family.updated",
      recordType: "part_family",
      recordId: family.id,
      old: familyRecord(family, `${oldSpec.code} rev ${oldSpec.revision}`),
      new: familyRecord(fields, `${spec.code} rev ${spec.revision}`),
      reason: reason ?? null,
    });
    return row;
  });
}
