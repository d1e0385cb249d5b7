import { asc, eq } from "drizzle-orm";
import { appendAudit, canonicalJson, sha256Hex } from "@/lib/audit";
import { successRunSampleSize } from "@/lib/stats";
import { buildTemplate } from "@/templates/documents";
import type { Tx } from "./client";
import { loadParametersInProcessOrder } from "./recipe-content";
import {
  cleaningSystems,
  cleanlinessSpecs,
  documentReviews,
  documents,
  documentVersions,
  partFamilies,
  recipes,
  recipeVersions,
  signatures,
  systemStages,
} from "./schema";
import { formatDate } from "@/lib/format/date";

/**
 * One effective, fully signed OQ protocol for the demo: Ines wrote it, Tomas
 * reviewed it, Helena approved it. Invented text from our own template.
 */
/** The OQ was written the week the valve-body recipe's version 2 took effect (CR-2025-001),
 * before the first run on it, and went through review and approval over three days. */
const OQ = {
  drafted: "2025-09-02T09:00:00.000Z",
  authored: "2025-09-02T15:00:00.000Z",
  reviewed: "2025-09-03T10:30:00.000Z",
  approved: "2025-09-04T14:00:00.000Z",
} as const;

export async function seedDemoDocuments(
  tx: Tx,
  people: {
    engineer: { id: string; name: string };
    reviewer: { id: string; name: string };
    approver: { id: string; name: string };
  },
) {
  const [system] = await tx.select().from(cleaningSystems).where(eq(cleaningSystems.code, "AW-3"));
  const stages = await tx
    .select()
    .from(systemStages)
    .where(eq(systemStages.systemId, system.id))
    .orderBy(asc(systemStages.position));
  const [family] = await tx
    .select({ f: partFamilies, s: cleanlinessSpecs })
    .from(partFamilies)
    .innerJoin(cleanlinessSpecs, eq(cleanlinessSpecs.id, partFamilies.specId))
    .where(eq(partFamilies.code, "PF-VB-210"));
  const [recipe] = await tx
    .select({ r: recipes, v: recipeVersions })
    .from(recipeVersions)
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .where(eq(recipes.code, "R-AW3-VB"))
    .orderBy(asc(recipeVersions.version));
  const effective = (
    await tx.select().from(recipeVersions).where(eq(recipeVersions.recipeId, recipe.r.id))
  ).find((v) => v.status === "effective")!;
  const params = await loadParametersInProcessOrder(tx, [effective.id]);

  const number = "OQ-AW3-0001";
  const sampleSize = successRunSampleSize(0.95, 0.9);
  const title = "OQ of the three-tank aqueous washer for valve bodies";
  const content = buildTemplate({
    type: "oq_protocol",
    number,
    title,
    system: { code: system.code, name: system.name, stages: stages.map((s) => s.name) },
    partFamily: {
      code: family.f.code,
      name: family.f.name,
      material: family.f.material,
      wettedAreaCm2: family.f.wettedAreaCm2,
      spec: family.s,
    },
    recipe: {
      code: recipe.r.code,
      name: recipe.r.name,
      version: effective.version,
      parameters: params.map((x) => ({
        name: x.name,
        setpoint: x.setpoint,
        unit: x.unit,
        low: x.validatedLow,
        high: x.validatedHigh,
      })),
    },
    sample: { confidencePct: 95, reliabilityPct: 90, size: sampleSize },
  });
  const contentHash = sha256Hex(canonicalJson(content));
  const effectiveDate = formatDate(OQ.approved);

  const [document] = await tx
    .insert(documents)
    .values({
      number,
      title,
      type: "oq_protocol",
      systemId: system.id,
      partFamilyId: family.f.id,
      recipeVersionId: effective.id,
      ownerId: people.engineer.id,
      createdAt: OQ.drafted,
    })
    .returning();
  const [version] = await tx
    .insert(documentVersions)
    .values({
      documentId: document.id,
      version: 1,
      status: "effective",
      content,
      contentHash,
      lockVersion: 1,
      effectiveDate,
      reviewRound: 1,
      routing: "sequence",
      submittedAt: OQ.authored,
      approvedAt: OQ.approved,
      createdBy: people.engineer.id,
      createdAt: OQ.drafted,
    })
    .returning();
  await tx.insert(documentReviews).values([
    {
      versionId: version.id,
      round: 1,
      step: 1,
      role: "reviewer",
      assigneeId: people.reviewer.id,
      activatedAt: OQ.authored,
      dueAt: OQ.reviewed,
      decision: "reviewed",
      decidedAt: OQ.reviewed,
    },
    {
      versionId: version.id,
      round: 1,
      step: 2,
      role: "approver",
      assigneeId: people.approver.id,
      activatedAt: OQ.reviewed,
      dueAt: OQ.approved,
      decision: "approved",
      decidedAt: OQ.approved,
    },
  ]);
  await appendAudit(
    tx,
    people.engineer,
    {
      eventType: "document.created",
      recordType: "document",
      recordId: document.id,
      new: {
        number,
        title,
        type: "oq_protocol",
        system: system.code,
        partFamily: family.f.code,
        recipeVersion: `${recipe.r.code} v${effective.version}`,
        versionId: version.id,
        sampleSize,
      },
    },
    new Date(OQ.drafted),
  );
  for (const [person, meaning] of [
    [people.engineer, "authored"],
    [people.reviewer, "reviewed"],
    [people.approver, "approved"],
  ] as const) {
    const signedAt = OQ[meaning];
    const [sig] = await tx
      .insert(signatures)
      .values({
        recordType: "document_version",
        recordId: version.id,
        userId: person.id,
        printedName: person.name,
        meaning,
        signedAt,
        contentHash,
      })
      .returning();
    // A signature is always recorded as its signer's act, as the signing service records it.
    await appendAudit(
      tx,
      person,
      {
        eventType: "signature.applied",
        recordType: "signature",
        recordId: sig.id,
        new: {
          on: `document_version:${version.id}`,
          meaning,
          printedName: person.name,
          contentHash,
          signedAt,
        },
      },
      new Date(signedAt),
    );
  }
  await appendAudit(
    tx,
    // Approved with an effective date of the approval day: in force on the approver's signature.
    people.approver,
    {
      eventType: "document.effective",
      recordType: "document_version",
      recordId: version.id,
      new: { status: "effective", effectiveDate, version: version.version },
    },
    new Date(OQ.approved),
  );
}
