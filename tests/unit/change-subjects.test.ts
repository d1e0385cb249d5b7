import { asc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  auditEvents,
  changeRequestEquipment,
  changeRequests,
  cleaningSystems,
  cleanlinessSpecs,
  recipes,
  systemStages,
  users,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { DEMO_PASSWORD } from "@/db/seed-data";
import type { RichDoc } from "@/lib/documents/rich-text";
import { narrativeDocument } from "@/lib/changes/content";
import { DEFAULT_MATRIX } from "@/lib/changes/requalification";
import { assessEquipment, assessSpecification } from "@/lib/changes/subjects";
import type { EquipmentStage } from "@/lib/plant/equipment";
import { openChangeSchema, proposalSchema } from "@/lib/schemas/change";
import { reviseSpecSchema } from "@/lib/schemas/spec";
import { systemSchema } from "@/lib/schemas/system";
import { approveChange } from "@/lib/server/changes/approve-change";
import { assessChange } from "@/lib/server/changes/assess-change";
import { closeChange } from "@/lib/server/changes/close-change";
import { saveProposal } from "@/lib/server/changes/save-proposal";
import { loadChangeState } from "@/lib/server/changes/state";
import { verifyChange } from "@/lib/server/changes/verify-change";
import { saveDraft } from "@/lib/server/documents/save-draft";
import { openSpecificationChange, specChangeCandidates } from "@/lib/server/plant/open-spec-change";
import { reviseSpec } from "@/lib/server/plant/revise-spec";
import { updateSystem } from "@/lib/server/systems/update-system";
import { compareSpecRevisions, type SpecLimits } from "@/lib/specs/compare";
import { proposalForm } from "./support/proposal-form";
import { createTestDatabase } from "./support/test-db";

const stage = (over: Partial<EquipmentStage>): EquipmentStage => ({
  name: "Spray wash",
  kind: "wash",
  capabilities: ["spray"],
  tankVolumeL: 400,
  filterRatingUm: 50,
  ultrasonicPowerW: null,
  ultrasonicFrequencyKHz: null,
  sprayPressureBar: 4,
  injectionPressureBar: null,
  nozzleSet: "NS-1",
  ...over,
});

const limits: SpecLimits = {
  ccc: "A(B-D17/E15/F13/G11/H9/I-J3/K-N00)",
  maxMetallicUm: 600,
  maxNonMetallicUm: 1000,
  maxFibreUm: null,
  gravimetricLimitMg: 2,
  gravimetricBasis: "per_component",
  minWettingTensionMNm: null,
  visualCriteria: null,
  drynessCriteria: null,
  extraRequirements: null,
  customerApprovesChanges: false,
};

describe("what an equipment change calls for", () => {
  it("a coarser filter is major and calls up the matrix rows of its kind of stage", () => {
    const out = assessEquipment([stage({})], [stage({ filterRatingUm: 100 })]);
    expect(out.impact).toBe("major");
    expect(out.assessment.triggers.map((t) => t.subject)).toEqual(["stage:wash"]);
  });
  it("a new nozzle set and a removed ultrasonic mode are major; a larger bath is minor with no trigger", () => {
    expect(assessEquipment([stage({})], [stage({ nozzleSet: "NS-2" })]).impact).toBe("major");
    const us = stage({
      capabilities: ["ultrasonic", "flood"],
      ultrasonicPowerW: 6000,
      ultrasonicFrequencyKHz: 40,
    });
    expect(assessEquipment([us], [{ ...us, capabilities: ["flood"] }]).impact).toBe("major");
    const bath = assessEquipment([stage({})], [stage({ tankVolumeL: 450 })]);
    expect(bath.impact).toBe("minor");
    expect(bath.assessment.triggers).toEqual([]);
  });
});

describe("what a specification revision calls for", () => {
  it("a lower class limit is major and calls for the particle test at the matrix's new-part-family sample size", () => {
    // 95 % confidence, 90 % reliability → 29 parts (success-run theorem, n = ln 0.05 / ln 0.9).
    const out = assessSpecification(
      compareSpecRevisions(limits, { ...limits, ccc: "A(B-D16/E15/F13/G11/H9/I-J3/K-N00)" }),
      DEFAULT_MATRIX,
    );
    expect(out.impact).toBe("major");
    expect(out.tests.map((t) => [t.testType, t.samples])).toEqual([["particle_cleanliness", 29]]);
  });
  it("a new wetting-tension limit calls for the wetting test, taken from its largest matrix row when no part-family row names it", () => {
    const matrix = [
      {
        subject: "parameter:concentration" as const,
        testType: "wetting_tension" as const,
        confidencePct: 90,
        reliabilityPct: 90,
      },
    ];
    const out = assessSpecification(
      compareSpecRevisions(limits, { ...limits, minWettingTensionMNm: 38 }),
      matrix,
    );
    expect(out.tests.map((t) => [t.testType, t.samples])).toEqual([["wetting_tension", 22]]);
  });
  it("loosening is minor with no tests; the same limits are editorial", () => {
    const looser = assessSpecification(
      compareSpecRevisions(limits, { ...limits, gravimetricLimitMg: 3 }),
      DEFAULT_MATRIX,
    );
    expect(looser).toEqual({ impact: "minor", triggers: [], tests: [] });
    expect(assessSpecification(compareSpecRevisions(limits, limits), DEFAULT_MATRIX).impact).toBe(
      "editorial",
    );
  });
  it("equipment and specification changes are opened from their own record, not the generic form", () => {
    const base = { recipeId: crypto.randomUUID(), title: "Coarser filter" };
    expect(openChangeSchema.safeParse({ ...base, kind: "equipment" }).success).toBe(false);
    expect(openChangeSchema.safeParse({ ...base, kind: "specification" }).success).toBe(false);
  });
});

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const people: Record<string, { id: string; name: string }> = {};

beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  for (const role of ["engineer", "approver", "reviewer", "admin"]) {
    const [u] = await t.db
      .select()
      .from(users)
      .where(eq(users.email, `${role}@fennmoor.example`));
    people[role] = { id: u.id, name: u.name };
  }
});
afterAll(() => t.cleanup());

async function writeNarrative(changeRequestId: string, text: string) {
  const s = await loadChangeState(t.db, changeRequestId);
  await saveDraft(
    { ...people.engineer, roles: ["engineer"] },
    {
      versionId: s.narrative!.id,
      lockVersion: s.narrative!.lockVersion,
      content: narrativeDocument(text) as RichDoc,
      overwrite: false,
    },
  );
}
const signing = async (id: string) => ({
  changeRequestId: id,
  password: DEMO_PASSWORD,
  contentHash: (await loadChangeState(t.db, id)).contentHash,
});
/** A minor change needs no tests: submitted, approved, verified and closed by three people. */
async function routeMinor(id: string, why: string) {
  await writeNarrative(id, why);
  await assessChange(people.engineer, await signing(id));
  await approveChange(people.approver, await signing(id));
  await verifyChange(people.reviewer, await signing(id));
  await closeChange(people.approver, { changeRequestId: id });
}

describe("an equipment change request", () => {
  it("shows the equipment diff, and its closure writes the new equipment to the washer with the change named", async () => {
    const [sys] = await t.db.select().from(cleaningSystems).where(eq(cleaningSystems.code, "SC-1"));
    const stages = await t.db
      .select()
      .from(systemStages)
      .where(eq(systemStages.systemId, sys.id))
      .orderBy(asc(systemStages.position));
    const bigger = (stages[0].tankVolumeL ?? 100) + 50;
    const { changeRequestId } = await updateSystem(
      people.admin,
      systemSchema.parse({
        systemId: sys.id,
        name: sys.name,
        description: sys.description ?? "",
        stages: stages.map((s, i) => ({
          id: s.id,
          name: s.name,
          kind: s.kind,
          capabilities: s.capabilities,
          tankVolumeL: String(i === 0 ? bigger : (s.tankVolumeL ?? "")),
        })),
      }),
    );
    const state = await loadChangeState(t.db, changeRequestId!);
    expect(state.assessmentRow.kind).toBe("equipment");
    expect(state.subject).toMatchObject({ kind: "equipment", system: "SC-1" });
    expect(state.impact).toBe("minor");
    expect(state.requirements).toEqual([]);

    await routeMinor(changeRequestId!, "A larger wash tank for the longer shift; same chemistry.");
    const [after] = await t.db.select().from(systemStages).where(eq(systemStages.id, stages[0].id));
    expect(after.tankVolumeL).toBe(bigger);
    const [link] = await t.db
      .select()
      .from(changeRequestEquipment)
      .where(eq(changeRequestEquipment.changeRequestId, changeRequestId!));
    expect(link.appliedAt).not.toBeNull();
    const events = await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, sys.id));
    expect(events.at(-1)).toMatchObject({
      action: "cleaning_system.updated",
      reason: `Equipment change ${state.cr.number} closed.`,
    });
  });
});

describe("a specification change request", () => {
  it("a tightened revision offers one change request per qualified recipe: major, with the particle and gravimetric tests", async () => {
    const [old] = await t.db
      .select()
      .from(cleanlinessSpecs)
      .where(eq(cleanlinessSpecs.code, "CS-VB-01"));
    const revised = await reviseSpec(
      people.engineer,
      reviseSpecSchema.parse({
        ...old,
        specId: old.id,
        revision: "D",
        ccc: "A(B-D17/E15/F13/G11/H9/I-J3/K-N00)",
        gravimetricLimitMg: "1.5",
        partFamilyIds: [],
        reason: "Customer issued revision D with a lower residue limit.",
        customerApprovesChanges: old.customerApprovesChanges ? "on" : "",
        sourceFileId: "",
      }),
    );
    // The superseded revision offers nothing: only the one in force is acted on.
    expect(await specChangeCandidates(old.id, t.db)).toBeNull();
    const offer = await specChangeCandidates(revised.specId, t.db);
    expect(offer!.comparison.tightens).toBe(true);
    expect(offer!.recipes.map((r) => `${r.code} v${r.version}`)).toEqual(["R-AW3-VB v2"]);

    const [other] = await t.db.select().from(recipes).where(eq(recipes.code, "R-SC1-SF"));
    await expect(
      openSpecificationChange(people.engineer, { specId: revised.specId, recipeId: other.id }),
    ).rejects.toThrow("That recipe is not qualified for a part family on this specification.");
    await expect(
      openSpecificationChange(people.engineer, { specId: old.id, recipeId: other.id }),
    ).rejects.toThrow(/revision in force that superseded another/);

    const cr = await openSpecificationChange(people.engineer, {
      specId: revised.specId,
      recipeId: offer!.recipes[0].recipeId,
    });
    const state = await loadChangeState(t.db, cr.id);
    expect(state.assessmentRow.kind).toBe("specification");
    expect(state.subject).toMatchObject({
      kind: "specification",
      fromRevision: "C",
      toRevision: "D",
    });
    expect(state.impact).toBe("major");
    expect(state.requirements.map((r) => r.testType)).toEqual([
      "gravimetric",
      "particle_cleanliness",
    ]);
    expect(
      (await specChangeCandidates(revised.specId, t.db))!.recipes[0].changeRequest?.number,
    ).toBe(cr.number);
    await expect(
      openSpecificationChange(people.engineer, {
        specId: revised.specId,
        recipeId: offer!.recipes[0].recipeId,
      }),
    ).rejects.toThrow(`Change request ${cr.number} is already open for this revision on R-AW3-VB.`);
    // Its kind stays: the diff comes from the revised specification, not from the recipe.
    await expect(
      saveProposal(people.engineer, proposalSchema.parse(proposalForm(state))),
    ).rejects.toThrow(
      'This change was opened as "Customer specification revised": its kind stays as it is.',
    );
    // Submitted unchanged: the recipe stays as it is, the new limits are what is assessed.
    await writeNarrative(
      cr.id,
      "Revision D lowers the residue limit; the recipe is kept and proven against it.",
    );
    await assessChange(people.engineer, await signing(cr.id));
    const [stored] = await t.db.select().from(changeRequests).where(eq(changeRequests.id, cr.id));
    expect(stored).toMatchObject({ status: "impact_assessed", impact: "major" });
  });

  it("a loosened revision is a minor change request that closes on approval alone", async () => {
    const offers = await t.db
      .select()
      .from(cleanlinessSpecs)
      .where(eq(cleanlinessSpecs.status, "in_force"));
    // Find an in-force specification whose families have a qualified recipe with no change open.
    for (const spec of offers) {
      if (spec.code === "CS-VB-01") continue;
      const revised = await reviseSpec(
        people.engineer,
        reviseSpecSchema.parse({
          ...spec,
          specId: spec.id,
          revision: `${spec.revision}-L`,
          maxFibreUm: String((spec.maxFibreUm ?? 2000) + 500),
          partFamilyIds: [],
          reason: "Fibre limit relaxed by the customer.",
          customerApprovesChanges: spec.customerApprovesChanges ? "on" : "",
          sourceFileId: "",
        }),
      );
      const offer = await specChangeCandidates(revised.specId, t.db);
      if (!offer?.recipes.length) continue;
      expect(offer.comparison.tightens).toBe(false);
      let cr: { id: string } | null = null;
      for (const r of offer.recipes) {
        cr = await openSpecificationChange(people.engineer, {
          specId: revised.specId,
          recipeId: r.recipeId,
        }).catch(() => null);
        if (cr) break;
      }
      if (!cr) continue;
      const state = await loadChangeState(t.db, cr.id);
      expect(state.impact).toBe("minor");
      await routeMinor(cr.id, "Looser fibre limit: the recipe meets it with margin.");
      const [closed] = await t.db.select().from(changeRequests).where(eq(changeRequests.id, cr.id));
      expect(closed.status).toBe("closed");
      return;
    }
    throw new Error("The demo has no specification with a qualified recipe free of open changes.");
  });
});
