import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  auditEvents,
  changeRequests,
  cleaningSystems,
  cleanlinessSpecs,
  controlPlans,
  documents,
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  testRuns,
  users,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { partFamilySchema, updatePartFamilySchema } from "@/lib/schemas/part-family";
import { reviseSpecSchema, specSchema } from "@/lib/schemas/spec";
import { qualifyCombinationSchema } from "@/lib/schemas/combination";
import { createRun } from "@/lib/server/evidence/create-run";
import {
  CURRENT_VERSION_STATUSES,
  protocolsFor,
  runFormOptions,
  versionsUsedWith,
} from "@/lib/server/evidence/queries";
import { computeStoredOutcome } from "@/lib/server/evidence/refresh-outcome";
import { createPartFamily } from "@/lib/server/plant/create-part-family";
import { createSpec } from "@/lib/server/plant/create-spec";
import { qualifyCombination } from "@/lib/server/plant/qualify-combination";
import { reviseSpec } from "@/lib/server/plant/revise-spec";
import { updatePartFamily } from "@/lib/server/plant/update-part-family";
import { runCombinationRefusal } from "@/lib/plant/combination";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let engineer: { id: string; name: string };
let technicianId: string;
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  const person = async (email: string) =>
    (
      await t.db
        .select({ id: users.id, name: users.name })
        .from(users)
        .where(eq(users.email, email))
    )[0];
  engineer = await person("engineer@fennmoor.example");
  technicianId = (await person("technician@fennmoor.example")).id;
});
afterAll(() => t.cleanup());

const family = async (code: string) =>
  (await t.db.select().from(partFamilies).where(eq(partFamilies.code, code)))[0];
const specByCode = async (code: string) =>
  t.db.select().from(cleanlinessSpecs).where(eq(cleanlinessSpecs.code, code));
const version = async (recipeCode: string, n: number) =>
  (
    await t.db
      .select({ v: recipeVersions })
      .from(recipeVersions)
      .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
      .where(and(eq(recipes.code, recipeCode), eq(recipeVersions.version, n)))
  )[0].v;
const eventsOn = async (recordId: string) =>
  (await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, recordId))).map(
    (e) => e.action,
  );

const newSpec = {
  code: "CS-MN-05",
  name: "Manifold block, bonding grade",
  customer: "Ostwick Fluid Power",
  documentNumber: "OFP-CL-220",
  revision: "A",
  ccc: "A(B-E17/F-G14/H-I6/J-N00)",
  maxMetallicUm: "500",
  maxNonMetallicUm: "800",
  maxFibreUm: "",
  gravimetricLimitMg: "3,5",
  gravimetricBasis: "per_component",
  minWettingTensionMNm: "40",
  visualCriteria: "No stains",
  drynessCriteria: "Dry to touch",
  extraRequirements: "",
  customerApprovesChanges: "on",
};

describe("the customer specification register", () => {
  it("registers a specification with customer, document and revision, audited", async () => {
    const spec = await createSpec(engineer, specSchema.parse(newSpec));
    expect(spec).toMatchObject({
      customer: "Ostwick Fluid Power",
      documentNumber: "OFP-CL-220",
      revision: "A",
      status: "in_force",
      gravimetricLimitMg: 3.5,
      customerApprovesChanges: true,
      maxFibreUm: null,
    });
    expect(await eventsOn(spec.id)).toEqual(["cleanliness_spec.created"]);
    await expect(createSpec(engineer, specSchema.parse(newSpec))).rejects.toThrow(
      /CS-MN-05 is already in the register: add a revision/,
    );
  });

  it("refuses a malformed cleanliness code beside its field, naming the position", () => {
    const r = specSchema.safeParse({ ...newSpec, ccc: "A(B-E17/F-G1X)" });
    expect(r.error?.issues[0].path).toEqual(["ccc"]);
    expect(r.error?.issues[0].message).toMatch(/at character 12/);
    const g = specSchema.safeParse({ ...newSpec, gravimetricBasis: "" });
    expect(g.error?.issues.map((i) => i.path.join("."))).toEqual(["gravimetricBasis"]);
  });

  it("a new revision supersedes the old, moves its families, and keeps runs on the revision they were opened under", async () => {
    const valveBody = await family("PF-VB-210");
    const [old] = await specByCode("CS-VB-01");
    const v2 = await version("R-AW3-VB", 2);
    const run = await createRun(engineer, {
      partFamilyId: valveBody.id,
      recipeVersionId: v2.id,
      testType: "particle_cleanliness",
      technicianId,
      lab: "Larchfield lab",
      performedOn: "2026-11-30",
    });
    expect(run.specId).toBe(old.id);

    // Level 18 → 17 on B-D (250 000 [memory] → 130 000 [std, ISO 16232:2018 level table] per 1000 cm²) tightens.
    const input = reviseSpecSchema.parse({
      ...old,
      specId: old.id,
      revision: "D",
      ccc: "A(B-D17/E15/F13/G11/H9/I-J3/K-N00)",
      gravimetricLimitMg: "1.5",
      partFamilyIds: [],
      reason: "Customer issued revision D with a lower residue limit.",
      customerApprovesChanges: old.customerApprovesChanges ? "on" : "",
      sourceFileId: "",
    });
    const result = await reviseSpec(engineer, input);
    expect(result.comparison.tightens).toBe(true);
    expect(result.comparison.changes.map((c) => [c.field, c.direction])).toEqual([
      ["ccc", "tightened"],
      ["gravimetricLimitMg", "tightened"],
    ]);
    expect(result.affected.partFamilies.map((f) => f.code)).toEqual(["PF-VB-210"]);
    expect(result.affected.recipes.map((r) => `${r.code} v${r.version}`)).toEqual(["R-AW3-VB v2"]);

    const revisions = await specByCode("CS-VB-01");
    expect(revisions.map((r) => [r.revision, r.status]).sort()).toEqual([
      ["C", "superseded"],
      ["D", "in_force"],
    ]);
    expect((await family("PF-VB-210")).specId).toBe(result.specId);
    expect(revisions.find((r) => r.revision === "D")?.supersedesId).toBe(old.id);
    // The run opened under C is still judged by C.
    const [stored] = await t.db.select().from(testRuns).where(eq(testRuns.id, run.id));
    expect(stored.specId).toBe(old.id);
    expect(await eventsOn(old.id)).toContain("cleanliness_spec.superseded");
    expect(await eventsOn(valveBody.id)).toContain("part_family.updated");
    await computeStoredOutcome(t.db, stored); // still computes against its own revision

    await expect(reviseSpec(engineer, { ...input, revision: "E" })).rejects.toThrow(
      /already superseded: revise the revision in force/,
    );
    await expect(reviseSpec(engineer, { ...input, specId: result.specId })).rejects.toThrow(
      /already has a revision D/,
    );
  });

  it("a loosening revision lists nothing to re-examine", async () => {
    const [spec] = await specByCode("CS-PH-02");
    const result = await reviseSpec(
      engineer,
      reviseSpecSchema.parse({
        ...spec,
        specId: spec.id,
        revision: "3",
        maxFibreUm: "2500",
        partFamilyIds: [],
        reason: "Fibre limit relaxed by the customer.",
        customerApprovesChanges: "",
        sourceFileId: "",
      }),
    );
    expect(result.comparison.tightens).toBe(false);
    expect(result.affected).toEqual({ partFamilies: [], recipes: [] });
  });
});

describe("part families", () => {
  const typed = {
    code: "PF-MN-05",
    name: "Manifold block MN-05",
    partNumbers: "MN-05-A, MN-05-B\nMN-05-A",
    material: "Aluminium 6082-T6",
    wettedAreaCm2: "612,5",
    wettedAreaMethod: "cad_model",
    wettedAreaNote: "",
    wettedVolumeCm3: "",
    drawingNumber: "D-MN-05",
    drawingRevision: "A",
    customer: "Ostwick Fluid Power",
    description: "",
  };

  it("creates a family with its part numbers, wetted area and drawing, audited", async () => {
    const [spec] = await specByCode("CS-MN-05");
    const row = await createPartFamily(
      engineer,
      partFamilySchema.parse({ ...typed, specId: spec.id }),
    );
    expect(row).toMatchObject({
      partNumbers: ["MN-05-A", "MN-05-B"],
      wettedAreaCm2: 612.5,
      wettedAreaMethod: "cad_model",
      drawingRevision: "A",
      specId: spec.id,
    });
    expect(await eventsOn(row.id)).toEqual(["part_family.created"]);
  });

  it("refuses a clash of code or part number, naming the family that holds it", async () => {
    const [spec] = await specByCode("CS-MN-05");
    await expect(
      createPartFamily(
        engineer,
        partFamilySchema.parse({ ...typed, specId: spec.id, partNumbers: "" }),
      ),
    ).rejects.toThrow(/PF-MN-05 is already the part family PF-MN-05's/);
    await expect(
      createPartFamily(
        engineer,
        partFamilySchema.parse({
          ...typed,
          code: "PF-MN-06",
          partNumbers: "mn-05-b",
          specId: spec.id,
        }),
      ),
    ).rejects.toThrow(/Part number mn-05-b already belongs to part family PF-MN-05/);
    const superseded = (await specByCode("CS-VB-01")).find((s) => s.status === "superseded")!;
    await expect(
      createPartFamily(
        engineer,
        partFamilySchema.parse({
          ...typed,
          code: "PF-MN-07",
          partNumbers: "",
          specId: superseded.id,
        }),
      ),
    ).rejects.toThrow(/is superseded: choose the revision in force/);
  });

  it("refuses a zero or negative wetted area and an unknown method beside their fields", () => {
    const r = partFamilySchema.safeParse({
      ...typed,
      wettedAreaCm2: "0",
      wettedAreaMethod: "guessed",
      specId: "x",
    });
    expect(r.error?.issues.map((i) => i.path.join("."))).toEqual([
      "wettedAreaCm2",
      "wettedAreaMethod",
      "specId",
    ]);
    expect(
      partFamilySchema.safeParse({ ...typed, wettedAreaCm2: "-3", specId: crypto.randomUUID() })
        .error?.issues[0].message,
    ).toBe("Wetted area must be greater than 0 cm².");
  });

  it("an edit of a family in use needs a reason; the audit keeps old and new", async () => {
    const fitting = await family("PF-SF-12");
    const edit = updatePartFamilySchema.parse({
      ...fitting,
      partFamilyId: fitting.id,
      partNumbers: fitting.partNumbers.join(","),
      wettedAreaCm2: "39.2",
      wettedAreaMethod: "measured",
      reason: "",
    });
    await expect(updatePartFamily(engineer, edit)).rejects.toThrow(
      /PF-SF-12 is in use .*give the reason/,
    );
    await updatePartFamily(engineer, { ...edit, reason: "Area re-measured by 3D scan." });
    const [event] = await t.db
      .select()
      .from(auditEvents)
      .where(
        and(eq(auditEvents.recordId, fitting.id), eq(auditEvents.action, "part_family.updated")),
      );
    expect(JSON.parse(event.oldValue!).wettedAreaCm2).toBe(38);
    expect(JSON.parse(event.newValue!).wettedAreaCm2).toBe(39.2);
    expect(event.reason).toBe("Area re-measured by 3D scan.");
  });
});

describe("qualified combinations", () => {
  it("the rule: qualified, being requalified by its change, or under its protocol; otherwise refused naming the combination", () => {
    const facts = {
      familyCode: "PF-PH-400",
      recipeCode: "R-SC1-SF",
      version: 2,
      qualified: false,
      requalifiesIt: false,
      protocolForIt: false,
    };
    expect(runCombinationRefusal(facts)).toMatch(/^PF-PH-400 is not qualified on R-SC1-SF v2/);
    expect(runCombinationRefusal({ ...facts, qualified: true })).toBeNull();
    expect(runCombinationRefusal({ ...facts, requalifiesIt: true })).toBeNull();
    expect(runCombinationRefusal({ ...facts, protocolForIt: true })).toBeNull();
  });

  it("createRun refuses a pump housing on the fitting recipe and writes nothing", async () => {
    const pump = await family("PF-PH-400");
    const sf2 = await version("R-SC1-SF", 2);
    const before = (await t.db.select().from(testRuns)).length;
    await expect(
      createRun(engineer, {
        partFamilyId: pump.id,
        recipeVersionId: sf2.id,
        testType: "gravimetric",
        technicianId,
        lab: "Larchfield lab",
        performedOn: "2026-11-30",
      }),
    ).rejects.toThrow("PF-PH-400 is not qualified on R-SC1-SF v2");
    expect(await t.db.select().from(testRuns)).toHaveLength(before);
  });

  it("a validation protocol written for the combination lets its runs open before it is qualified", async () => {
    const manifold = await family("PF-MN-05");
    const ph1 = await version("R-AW3-PH", 1);
    const [protocol] = await t.db
      .insert(documents)
      .values({
        number: "PQ-MN-05",
        title: "PQ manifold block",
        type: "pq_protocol",
        partFamilyId: manifold.id,
        recipeVersionId: ph1.id,
        ownerId: engineer.id,
      })
      .returning();
    const input = {
      partFamilyId: manifold.id,
      recipeVersionId: ph1.id,
      testType: "gravimetric" as const,
      technicianId,
      lab: "Larchfield lab",
      performedOn: "2026-11-30",
    };
    await expect(createRun(engineer, input)).rejects.toThrow(
      /PF-MN-05 is not qualified on R-AW3-PH v1/,
    );
    const run = await createRun(engineer, { ...input, protocolDocumentId: protocol.id });
    expect(run.protocolDocumentId).toBe(protocol.id);
  });

  it("offers a new run the protocols for its part family and recipe version, and current versions unless asked for all", async () => {
    const manifold = await family("PF-MN-05");
    const valveBody = await family("PF-VB-210");
    const ph1 = await version("R-AW3-PH", 1);
    const numbers = async (f: string, v: string) => (await protocolsFor(f, v)).map((p) => p.number);
    expect(await numbers(manifold.id, ph1.id)).toContain("PQ-MN-05");
    expect(await numbers(valveBody.id, ph1.id)).not.toContain("PQ-MN-05");
    // A protocol that names neither a family nor a version is offered with every combination.
    await t.db.insert(documents).values({
      number: "IQ-ANY-01",
      title: "IQ of the plant's washers",
      type: "iq_protocol",
      ownerId: engineer.id,
    });
    expect(await numbers(valveBody.id, ph1.id)).toContain("IQ-ANY-01");
    // An IQ written for a washer alone goes with the runs of that washer's recipes only.
    const systems = await t.db.select().from(cleaningSystems);
    const aw3 = systems.find((x) => x.code === "AW-3")!;
    const other = systems.find((x) => x.code !== "AW-3")!;
    await t.db.insert(documents).values([
      {
        number: "IQ-AW3-09",
        title: "IQ of AW-3",
        type: "iq_protocol",
        systemId: aw3.id,
        ownerId: engineer.id,
      },
      {
        number: "IQ-OTHER-09",
        title: "IQ elsewhere",
        type: "iq_protocol",
        systemId: other.id,
        ownerId: engineer.id,
      },
    ]);
    expect(await numbers(valveBody.id, ph1.id)).toContain("IQ-AW3-09");
    expect(await numbers(valveBody.id, ph1.id)).not.toContain("IQ-OTHER-09");
    // Procedures and reports are never a run's protocol.
    expect(await numbers(valveBody.id, ph1.id)).not.toContain("SOP-AW3-0001");

    const statusOf = new Map(
      (await t.db.select().from(recipeVersions)).map((v) => [v.id, v.status]),
    );
    const current = await runFormOptions();
    const all = await runFormOptions("all");
    expect(all.versions).toHaveLength(statusOf.size);
    expect(current.versions.map((v) => v.id)).toEqual(
      all.versions
        .map((v) => v.id)
        .filter((id) => CURRENT_VERSION_STATUSES.includes(statusOf.get(id) as never)),
    );
    expect([...statusOf.values()]).toContain("superseded");
    expect(current.versions.length).toBeLessThan(all.versions.length);
  });

  it("lists first, for a family, the versions it was run, qualified or planned with, and no other", async () => {
    const pairs = [
      ...(await t.db
        .select({ f: testRuns.partFamilyId, v: testRuns.recipeVersionId })
        .from(testRuns)),
      ...(await t.db
        .select({
          f: requalificationIntervals.partFamilyId,
          v: requalificationIntervals.recipeVersionId,
        })
        .from(requalificationIntervals)),
      ...(await t.db
        .select({ f: controlPlans.partFamilyId, v: controlPlans.recipeVersionId })
        .from(controlPlans)),
    ];
    const families = await t.db.select({ id: partFamilies.id }).from(partFamilies);
    let listed = 0;
    for (const { id } of families) {
      const expected = [...new Set(pairs.filter((p) => p.f === id).map((p) => p.v))].sort();
      expect((await versionsUsedWith(id)).sort(), id).toEqual(expected);
      listed += expected.length;
    }
    expect(listed).toBeGreaterThan(0);
    // A family with no records yet lists none: the form then offers every version as one list.
    expect(await versionsUsedWith("00000000-0000-4000-8000-00000000dead")).toEqual([]);
  });

  it("qualifies a combination once, audited, and then runs open on it", async () => {
    const manifold = await family("PF-MN-05");
    const ph1 = await version("R-AW3-PH", 1);
    const input = qualifyCombinationSchema.parse({
      recipeVersionId: ph1.id,
      partFamilyId: manifold.id,
      basis: "PQ report VR-2026-014",
      qualifiedOn: "2026-12-01",
      intervalMonths: "12",
    });
    const row = await qualifyCombination(engineer, input);
    expect(await eventsOn(row.id)).toEqual(["combination.qualified"]);
    await expect(qualifyCombination(engineer, input)).rejects.toThrow(
      /PF-MN-05 on R-AW3-PH v1 is already a qualified combination/,
    );
    await expect(
      createRun(engineer, {
        partFamilyId: manifold.id,
        recipeVersionId: ph1.id,
        testType: "gravimetric",
        technicianId,
        lab: "Larchfield lab",
        performedOn: "2026-12-02",
      }),
    ).resolves.toMatchObject({ partFamilyId: manifold.id });
  });

  it("refuses to qualify a version not yet proven", async () => {
    const [proposed] = await t.db
      .select()
      .from(recipeVersions)
      .where(eq(recipeVersions.status, "proposed"))
      .limit(1);
    const manifold = await family("PF-MN-05");
    await expect(
      qualifyCombination(engineer, {
        recipeVersionId: proposed.id,
        partFamilyId: manifold.id,
        basis: "Too early",
        qualifiedOn: "2026-12-01",
        intervalMonths: 12,
      }),
    ).rejects.toThrow(/is proposed: it is qualified when the change/);
  });
});

describe("runs on a proposed recipe version", () => {
  it("open for a family the change requalifies, linked or not yet; refused for a family the change does not cover", async () => {
    const [proposed] = await t.db
      .select({ v: recipeVersions, from: changeRequests.fromVersionId })
      .from(changeRequests)
      .innerJoin(recipeVersions, eq(recipeVersions.id, changeRequests.toVersionId))
      .where(eq(recipeVersions.status, "proposed"))
      .limit(1);
    const [qualified] = await t.db
      .select()
      .from(requalificationIntervals)
      .where(eq(requalificationIntervals.recipeVersionId, proposed.from!));
    const input = {
      recipeVersionId: proposed.v.id,
      testType: "gravimetric" as const,
      technicianId,
      lab: "Larchfield lab",
      performedOn: "2026-12-02",
    };
    await expect(
      createRun(engineer, { ...input, partFamilyId: qualified.partFamilyId }),
    ).resolves.toMatchObject({ recipeVersionId: proposed.v.id });
    const other = (await t.db.select().from(partFamilies)).find(
      (f) => f.id !== qualified.partFamilyId && f.code !== "PF-MN-05",
    )!;
    await expect(createRun(engineer, { ...input, partFamilyId: other.id })).rejects.toThrow(
      `${other.code} is not qualified on`,
    );
  });
});
