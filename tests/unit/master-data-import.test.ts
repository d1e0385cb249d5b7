import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { auditEvents, cleanlinessSpecs, partFamilies, users } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { parseMasterDataCsv } from "@/lib/plant/csv-master-data";
import { importMasterData } from "@/lib/server/plant/import-master-data";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let engineer: { id: string; name: string };
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  engineer = (
    await t.db
      .select({ id: users.id, name: users.name })
      .from(users)
      .where(eq(users.email, "engineer@fennmoor.example"))
  )[0];
});
afterAll(() => t.cleanup());

const SPECS =
  "code,name,customer,document_number,revision,ccc,gravimetric_limit_mg,gravimetric_basis\n" +
  "CS-IMP-01,Rail block,Ostwick Fluid Power,OFP-CL-300,A,A(B-E17/F-G14/H-N00),2.5,per_component\n";
const FAMILIES =
  "code,name,part_numbers,material,wetted_area_cm2,wetted_area_method,spec_code\n" +
  "PF-IMP-1,Rail block RB-1,RB-1-01;RB-1-02,Aluminium 6082,310,cad_model,CS-IMP-01\n" +
  "PF-IMP-2,Rail block RB-2,RB-2-01,Aluminium 6082,295,measured,CS-IMP-01\n";

const count = async (table: typeof partFamilies | typeof cleanlinessSpecs) =>
  (await t.db.select().from(table)).length;

describe("importing master data", () => {
  it("saves a specification and the families that cite it, each audited as if typed", async () => {
    const specs = parseMasterDataCsv("specifications", SPECS);
    expect(await importMasterData(engineer, { kind: "specifications", rows: specs.rows })).toEqual({
      ok: true,
      imported: 1,
    });
    const families = parseMasterDataCsv("part_families", FAMILIES);
    expect(
      await importMasterData(engineer, { kind: "part_families", rows: families.rows }),
    ).toEqual({ ok: true, imported: 2 });
    const [rb1] = await t.db.select().from(partFamilies).where(eq(partFamilies.code, "PF-IMP-1"));
    const [spec] = await t.db
      .select()
      .from(cleanlinessSpecs)
      .where(eq(cleanlinessSpecs.code, "CS-IMP-01"));
    expect(rb1).toMatchObject({
      specId: spec.id,
      wettedAreaCm2: 310,
      partNumbers: ["RB-1-01", "RB-1-02"],
    });
    expect(
      (await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, rb1.id))).map(
        (e) => e.action,
      ),
    ).toEqual(["part_family.created"]);
  });

  it("imports nothing when one row clashes with the register, naming the line", async () => {
    const before = await count(partFamilies);
    const text =
      "code,name,part_numbers,material,wetted_area_cm2,spec_code\n" +
      "PF-IMP-3,Rail block RB-3,RB-3-01,Aluminium 6082,280,CS-IMP-01\n" +
      "PF-IMP-4,Rail block RB-4,RB-1-02,Aluminium 6082,280,CS-IMP-01\n" + // RB-1-02 is PF-IMP-1's
      "PF-IMP-5,Rail block RB-5,RB-5-01,Aluminium 6082,280,CS-NOPE\n";
    const rows = parseMasterDataCsv("part_families", text).rows;
    expect(rows).toHaveLength(3);
    const r = await importMasterData(engineer, { kind: "part_families", rows });
    expect(r).toEqual({
      ok: false,
      errors: [
        {
          line: 3,
          message: expect.stringMatching(
            /Part number RB-1-02 already belongs to part family PF-IMP-1/,
          ),
        },
        { line: 4, message: expect.stringMatching(/No specification CS-NOPE is in force/) },
      ],
    });
    expect(await count(partFamilies)).toBe(before);
  });

  it("refuses a specification code already in the register and keeps the file's other rows out", async () => {
    const before = await count(cleanlinessSpecs);
    const rows = parseMasterDataCsv(
      "specifications",
      SPECS.replace("CS-IMP-01", "CS-IMP-02") +
        SPECS.split("\n")[1].replace("CS-IMP-01", "CS-VB-01") +
        "\n",
    ).rows;
    const r = await importMasterData(engineer, { kind: "specifications", rows });
    expect(r).toEqual({
      ok: false,
      errors: [{ line: 3, message: expect.stringMatching(/CS-VB-01 is already in the register/) }],
    });
    expect(await count(cleanlinessSpecs)).toBe(before);
  });
});
