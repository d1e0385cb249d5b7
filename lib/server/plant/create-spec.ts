// Not "server-only": the demo seed calls `createSpecIn` under tsx.
import { eq, inArray } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { cleanlinessSpecs, evidenceFiles, partFamilies, type CleanlinessSpec } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { parseCleanlinessSpec } from "@/lib/cleanliness";
import type { SpecInput } from "@/lib/schemas/spec";
import { UserFacingError } from "@/lib/server/errors";

type Limits = Omit<SpecInput, "code" | "partFamilyIds">;

/** What the audit trail keeps of a revision: its identity and every limit (legacy rows may lack a customer). */
export function specRecord(
  s: Omit<Limits, "customer" | "documentNumber"> & {
    code: string;
    customer: string | null;
    documentNumber: string | null;
  },
) {
  return {
    code: s.code,
    name: s.name,
    customer: s.customer,
    documentNumber: s.documentNumber,
    revision: s.revision,
    sourceFileId: s.sourceFileId,
    ccc: s.ccc,
    maxMetallicUm: s.maxMetallicUm,
    maxNonMetallicUm: s.maxNonMetallicUm,
    maxFibreUm: s.maxFibreUm,
    gravimetricLimitMg: s.gravimetricLimitMg,
    gravimetricBasis: s.gravimetricBasis,
    minWettingTensionMNm: s.minWettingTensionMNm,
    visualCriteria: s.visualCriteria,
    drynessCriteria: s.drynessCriteria,
    extraRequirements: s.extraRequirements,
    customerApprovesChanges: s.customerApprovesChanges,
  };
}

/** The columns of a revision from validated input, the CCC written in its normal form. */
export function specValues(code: string, s: Limits) {
  return { ...specRecord({ ...s, code }), ccc: parseCleanlinessSpec(s.ccc).text };
}

export async function checkSourceFile(tx: Tx, fileId: string | null) {
  if (!fileId) return;
  const [file] = await tx
    .select({ id: evidenceFiles.id })
    .from(evidenceFiles)
    .where(eq(evidenceFiles.id, fileId));
  if (!file)
    throw new UserFacingError(
      "The source document was not found: upload it again.",
      "sourceFileId",
    );
}

/** Points the named part families at a specification revision, each move audited on the family. */
export async function applySpecToFamilies(
  tx: Tx,
  actor: AuditActor,
  spec: CleanlinessSpec,
  familyIds: string[],
  reason: string,
) {
  if (familyIds.length === 0) return [];
  const families = await tx.select().from(partFamilies).where(inArray(partFamilies.id, familyIds));
  if (families.length !== new Set(familyIds).size)
    throw new UserFacingError(
      "A part family in the list does not exist. Reload the page.",
      "partFamilyIds",
    );
  const oldSpecs = await tx
    .select()
    .from(cleanlinessSpecs)
    .where(
      inArray(
        cleanlinessSpecs.id,
        families.map((f) => f.specId),
      ),
    );
  const label = (id: string) => {
    const s = id === spec.id ? spec : oldSpecs.find((o) => o.id === id);
    return s ? `${s.code} rev ${s.revision}` : id;
  };
  for (const family of families) {
    if (family.specId === spec.id) continue;
    await tx
      .update(partFamilies)
      .set({ specId: spec.id, updatedAt: new Date().toISOString() })
      .where(eq(partFamilies.id, family.id));
    await appendAudit(tx, actor, {
      eventType: "part_family.updated",
      recordType: "part_family",
      recordId: family.id,
      old: { specification: label(family.specId) },
      new: { specification: label(spec.id) },
      reason,
    });
  }
  return families;
}

export async function createSpecIn(
  tx: Tx,
  actor: AuditActor,
  input: SpecInput,
): Promise<CleanlinessSpec> {
  const [existing] = await tx
    .select({ revision: cleanlinessSpecs.revision })
    .from(cleanlinessSpecs)
    .where(eq(cleanlinessSpecs.code, input.code))
    .limit(1);
  if (existing)
    throw new UserFacingError(
      `${input.code} is already in the register: add a revision to it instead.`,
      "code",
    );
  await checkSourceFile(tx, input.sourceFileId);
  const { partFamilyIds, ...limits } = input;
  const [spec] = await tx
    .insert(cleanlinessSpecs)
    .values(specValues(input.code, limits))
    .returning();
  await appendAudit(tx, actor, {
    eventType: "cleanliness_spec.created",
    recordType: "cleanliness_spec",
    recordId: spec.id,
    new: { ...specRecord({ ...limits, code: input.code }), ccc: spec.ccc },
  });
  await applySpecToFamilies(
    tx,
    actor,
    spec,
    partFamilyIds,
    `${spec.code} rev ${spec.revision} registered for this family.`,
  );
  return spec;
}

/** Registers a customer specification (its first revision here) and the part families it applies to. */
export async function createSpec(actor: AuditActor, input: SpecInput) {
  return getDb().transaction((tx) => createSpecIn(tx, actor, input));
}
