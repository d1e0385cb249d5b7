// Not "server-only": the demo seed calls `createPartFamilyIn` under tsx.
import { eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { cleanlinessSpecs, partFamilies, type PartFamily } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import type { PartFamilyInput } from "@/lib/schemas/part-family";
import { UserFacingError } from "@/lib/server/errors";

/** Refuses a code or a part number another family already holds, naming that family. */
export async function checkFamilyClashes(
  tx: Tx,
  input: Pick<PartFamilyInput, "code" | "partNumbers">,
  selfId: string | null,
) {
  const others = (
    await tx
      .select({
        id: partFamilies.id,
        code: partFamilies.code,
        partNumbers: partFamilies.partNumbers,
      })
      .from(partFamilies)
  ).filter((f) => f.id !== selfId);
  const sameCode = others.find((f) => f.code.toLowerCase() === input.code.toLowerCase());
  if (sameCode)
    throw new UserFacingError(
      `The code ${input.code} is already the part family ${sameCode.code}'s: choose another.`,
      "code",
    );
  for (const number of input.partNumbers) {
    const holder = others.find((f) =>
      f.partNumbers.some((n) => n.toLowerCase() === number.toLowerCase()),
    );
    if (holder)
      throw new UserFacingError(
        `Part number ${number} already belongs to part family ${holder.code}: a part is in one family only.`,
        "partNumbers",
      );
  }
}

export async function specInForce(tx: Tx, specId: string) {
  const [spec] = await tx.select().from(cleanlinessSpecs).where(eq(cleanlinessSpecs.id, specId));
  if (!spec) throw new UserFacingError("Choose the specification from the list.", "specId");
  if (spec.status !== "in_force")
    throw new UserFacingError(
      `${spec.code} revision ${spec.revision} is superseded: choose the revision in force.`,
      "specId",
    );
  return spec;
}

/** What the audit trail keeps of a family: every field the engineer typed. */
export function familyRecord(
  f: Omit<PartFamilyInput, "specId" | "wettedAreaMethod"> & { wettedAreaMethod: string | null },
  specLabel: string,
) {
  return {
    code: f.code,
    name: f.name,
    partNumbers: f.partNumbers,
    material: f.material,
    wettedAreaCm2: f.wettedAreaCm2,
    wettedAreaMethod: f.wettedAreaMethod,
    wettedAreaNote: f.wettedAreaNote,
    wettedVolumeCm3: f.wettedVolumeCm3,
    drawingNumber: f.drawingNumber,
    drawingRevision: f.drawingRevision,
    customer: f.customer,
    specification: specLabel,
    description: f.description,
  };
}

export async function createPartFamilyIn(
  tx: Tx,
  actor: AuditActor,
  input: PartFamilyInput,
): Promise<PartFamily> {
  await checkFamilyClashes(tx, input, null);
  const spec = await specInForce(tx, input.specId);
  const [row] = await tx.insert(partFamilies).values(input).returning();
  await appendAudit(tx, actor, {
    eventType: "part_family.created",
    recordType: "part_family",
    recordId: row.id,
    new: familyRecord(input, `${spec.code} rev ${spec.revision}`),
  });
  return row;
}

/** A new part family with the specification it must meet. */
export async function createPartFamily(actor: AuditActor, input: PartFamilyInput) {
  return getDb().transaction((tx) => createPartFamilyIn(tx, actor, input));
}
