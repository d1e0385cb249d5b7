import { asc, eq } from "drizzle-orm";
import { appendAudit, canonicalJson, sha256Hex } from "@/lib/audit";
import { successRunSampleSize } from "@/lib/stats";
import { buildTemplate } from "@/templates/documents";
import { approvals } from "@/templates/documents/common";
import { doc, h, ol, p, ul, type RichDoc } from "@/lib/documents/rich-text";
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
  await seedSignedEffectiveDocument(tx, people, OQ, {
    number,
    title,
    type: "oq_protocol",
    content,
    links: { systemId: system.id, partFamilyId: family.f.id, recipeVersionId: effective.id },
    facts: {
      system: system.code,
      partFamily: family.f.code,
      recipeVersion: `${recipe.r.code} v${effective.version}`,
      sampleSize,
    },
  });
  await seedSignedEffectiveDocument(tx, people, SOP, {
    number: "SOP-AW3-0001",
    title: BATH_CHANGE_TITLE,
    type: "procedure",
    content: bathChangeProcedure(system.code),
    links: { systemId: system.id, partFamilyId: null, recipeVersionId: null },
    facts: { system: system.code, partFamily: null, recipeVersion: null, sampleSize: null },
  });
}

/** The bath-change procedure technicians acknowledge before changing AW-3's baths: invented text of our own. */
const SOP = {
  drafted: "2025-09-08T08:30:00.000Z",
  authored: "2025-09-08T13:00:00.000Z",
  reviewed: "2025-09-09T09:15:00.000Z",
  approved: "2025-09-10T11:00:00.000Z",
} as const;
const BATH_CHANGE_TITLE = "Changing the wash bath and its filter on the three-tank washer";

function bathChangeProcedure(systemCode: string): RichDoc {
  return doc(
    h(1, `SOP-AW3-0001 — ${BATH_CHANGE_TITLE}`),
    p("Procedure. Read the whole document before the first bath change."),
    h(2, "Purpose"),
    p(
      `Replace the wash bath of washer ${systemCode} and its bag filter at the interval of the bath plan, or when a titration reading is beyond its reject limit, so that the next load is washed in a bath within its validated concentration.`,
    ),
    h(2, "Scope"),
    p(`Washer ${systemCode}, wash tank only. The rinse tanks have their own procedure.`),
    h(2, "Responsibilities"),
    ul(
      "Technician: carries out and records the bath change.",
      "Quality engineer: owns this procedure and the bath plan.",
    ),
    h(2, "Safety"),
    p(
      "Caution: the wash bath runs at up to 65 °C and the detergent is alkaline. Isolate the washer and lock it out before opening the filter housing or entering the tank area; let the bath cool before draining. Wear the eye, face and hand protection the detergent's safety data sheet names. Follow the site's safety data sheets, local codes and licensed practice; this document does not replace them.",
    ),
    h(2, "Steps"),
    ol(
      "Finish or divert the current load; record the time the washer stops.",
      "Isolate the washer and apply the lock-out; check that the pumps and heaters cannot start.",
      "Drain the wash tank to the site's effluent route once the bath is below 40 °C.",
      "Open the filter housing, replace the bag filter, and check the seal for damage.",
      "Rinse the tank, refill it with deionised water to the fill mark and dose the detergent to the recipe's setpoint.",
      "Remove the lock-out, heat the bath, titrate it and record the reading against the bath's limits.",
      "Record the bath change in Washproof, with the titration reading and the filter change.",
    ),
    ...approvals(),
  );
}

interface SeededDocument {
  number: string;
  title: string;
  type: "oq_protocol" | "procedure";
  content: RichDoc;
  links: { systemId: string; partFamilyId: string | null; recipeVersionId: string | null };
  /** What the creation event records beside the number, title and type. */
  facts: {
    system: string | null;
    partFamily: string | null;
    recipeVersion: string | null;
    sampleSize: number | null;
  };
}

/** A document written, reviewed and approved on the given dates, in force from its approval day. */
async function seedSignedEffectiveDocument(
  tx: Tx,
  people: {
    engineer: { id: string; name: string };
    reviewer: { id: string; name: string };
    approver: { id: string; name: string };
  },
  dates: { drafted: string; authored: string; reviewed: string; approved: string },
  seeded: SeededDocument,
) {
  const { number, title, type, content } = seeded;
  const contentHash = sha256Hex(canonicalJson(content));
  const effectiveDate = formatDate(dates.approved);

  const [document] = await tx
    .insert(documents)
    .values({
      number,
      title,
      type,
      ...seeded.links,
      ownerId: people.engineer.id,
      createdAt: dates.drafted,
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
      submittedAt: dates.authored,
      approvedAt: dates.approved,
      createdBy: people.engineer.id,
      createdAt: dates.drafted,
    })
    .returning();
  await tx.insert(documentReviews).values([
    {
      versionId: version.id,
      round: 1,
      step: 1,
      role: "reviewer",
      assigneeId: people.reviewer.id,
      activatedAt: dates.authored,
      dueAt: dates.reviewed,
      decision: "reviewed",
      decidedAt: dates.reviewed,
    },
    {
      versionId: version.id,
      round: 1,
      step: 2,
      role: "approver",
      assigneeId: people.approver.id,
      activatedAt: dates.reviewed,
      dueAt: dates.approved,
      decision: "approved",
      decidedAt: dates.approved,
    },
  ]);
  await appendAudit(
    tx,
    people.engineer,
    {
      eventType: "document.created",
      recordType: "document",
      recordId: document.id,
      new: { number, title, type, ...seeded.facts, versionId: version.id },
    },
    new Date(dates.drafted),
  );
  for (const [person, meaning] of [
    [people.engineer, "authored"],
    [people.reviewer, "reviewed"],
    [people.approver, "approved"],
  ] as const) {
    const signedAt = dates[meaning];
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
    new Date(dates.approved),
  );
}
