import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import {
  auditEvents,
  cleanlinessSpecs,
  evidenceFiles,
  partFamilies,
  requalificationIntervals,
  recipes,
  recipeVersions,
} from "@/db/schema";
import { seedDemo } from "@/db/seed";
import {
  createPartFamilyAction,
  qualifyCombinationAction,
  reviseSpecAction,
  updatePartFamilyAction,
} from "@/app/(app)/parts/actions";
import { GET as exportMasterData } from "@/app/api/parts/export/route";
import { POST as importMasterData } from "@/app/api/parts/import/route";
import { POST as uploadSpecSource } from "@/app/api/parts/specs/source/route";
import { listSpecRegister } from "@/lib/server/plant/parts-queries";
import { localStore, setStore } from "@/lib/storage";
import { actAs, invoke, peopleByRole } from "./support/endpoints";
import { createTestDatabase } from "./support/test-db";
import { NextRequest } from "next/server";

vi.mock("next/headers", async () => (await import("./support/request-context")).nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: vi.fn(), revalidateTag: vi.fn() }));
vi.mock("next/server", async (original) => ({
  ...(await original<typeof import("next/server")>()),
  after: vi.fn(),
}));

let t: Awaited<ReturnType<typeof createTestDatabase>>;
let people: Awaited<ReturnType<typeof peopleByRole>>;
beforeAll(async () => {
  t = await createTestDatabase();
  await seedDemo(t.db);
  people = await peopleByRole(t.db);
  setStore(localStore(mkdtempSync(join(tmpdir(), "washproof-parts-store-"))));
});
afterAll(() => t.cleanup());

const form = (fields: Record<string, string | string[]>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) for (const one of [v].flat()) f.append(k, one);
  return f;
};
const post = (url: string, body: FormData) => ({
  request: new NextRequest(`http://127.0.0.1${url}`, { method: "POST", body }),
  context: { params: Promise.resolve({}) },
});
const family = async (code: string) =>
  (await t.db.select().from(partFamilies).where(eq(partFamilies.code, code)))[0];
const spec = async (code: string) =>
  (
    await t.db
      .select()
      .from(cleanlinessSpecs)
      .where(and(eq(cleanlinessSpecs.code, code), eq(cleanlinessSpecs.status, "in_force")))
  )[0];

describe("part family actions", () => {
  it("creates a family for an engineer and sends them back to the list; an auditor is refused", async () => {
    const vb = await spec("CS-VB-01");
    const fields = {
      code: "PF-EC-7",
      name: "End cap EC-7",
      partNumbers: "EC-7-01, EC-7-02",
      material: "Brass CW614N",
      wettedAreaCm2: "64",
      wettedAreaMethod: "measured",
      specId: vb.id,
    };
    await actAs(people.auditor);
    expect(await createPartFamilyAction(null, form(fields))).toMatchObject({
      ok: false,
      status: 403,
    });
    await actAs(people.engineer);
    expect(await invoke(() => createPartFamilyAction(null, form(fields)))).toEqual({
      kind: "redirect",
      to: "/parts",
    });
    expect(await family("PF-EC-7")).toMatchObject({
      partNumbers: ["EC-7-01", "EC-7-02"],
      wettedAreaCm2: 64,
      specId: vb.id,
    });
  });

  it("asks for a reason beside the field when the family is in use, and saves with one", async () => {
    const vb = await family("PF-VB-210"); // the demo runs were opened on it
    const fields = {
      partFamilyId: vb.id,
      code: vb.code,
      name: vb.name,
      partNumbers: vb.partNumbers.join(","),
      material: vb.material,
      wettedAreaCm2: "425",
      wettedAreaMethod: "cad_model",
      specId: vb.specId,
    };
    await actAs(people.engineer);
    const refused = await updatePartFamilyAction(null, form(fields));
    expect(refused).toMatchObject({
      ok: false,
      fieldErrors: { reason: [expect.stringMatching(/PF-VB-210 is in use .*give the reason/)] },
    });
    expect((await family("PF-VB-210")).wettedAreaCm2).toBe(420);
    expect(
      await updatePartFamilyAction(
        null,
        form({ ...fields, reason: "CAD model rev G adds the cross bore." }),
      ),
    ).toMatchObject({ ok: true, message: "Saved." });
    expect((await family("PF-VB-210")).wettedAreaCm2).toBe(425);
  });
});

describe("revising a specification", () => {
  it("answers what a tightened limit affects: the families on it and the recipe versions qualified for them", async () => {
    const old = await spec("CS-VB-01");
    await actAs(people.engineer);
    const result = await reviseSpecAction(
      null,
      form({
        specId: old.id,
        reason: "Customer issued a tighter largest metallic particle.",
        name: old.name,
        customer: old.customer ?? "Harrowgate Injection Systems",
        documentNumber: old.documentNumber ?? "HIS-1",
        revision: "Z9",
        ccc: old.ccc,
        maxMetallicUm: String((old.maxMetallicUm ?? 1000) / 2),
        gravimetricLimitMg: old.gravimetricLimitMg === null ? "" : String(old.gravimetricLimitMg),
        gravimetricBasis: old.gravimetricBasis ?? "",
      }),
    );
    expect(result).toMatchObject({
      ok: true,
      tightens: true,
      changes: expect.arrayContaining([
        expect.objectContaining({ field: "maxMetallicUm", direction: "tightened" }),
      ]),
    });
    const affected = (
      result as { affected: { partFamilies: { code: string }[]; recipes: { code: string }[] } }
    ).affected;
    expect(affected.partFamilies.map((f) => f.code)).toContain("PF-VB-210");
    expect(affected.recipes.map((r) => r.code)).toContain("R-AW3-VB");
    expect((await spec("CS-VB-01")).revision).toBe("Z9");
  });
});

describe("qualifying a combination by hand", () => {
  it("records the pair with its basis, and refuses it a second time naming the combination", async () => {
    const [v] = await t.db
      .select({ id: recipeVersions.id })
      .from(recipeVersions)
      .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
      .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.status, "effective")));
    const ec = await family("PF-EC-7");
    const fields = {
      recipeVersionId: v.id,
      partFamilyId: ec.id,
      basis: "Customer PPAP report OFP-PPAP-77",
      qualifiedOn: "2026-11-20",
      intervalMonths: "12",
    };
    await actAs(people.engineer);
    expect(await qualifyCombinationAction(null, form(fields))).toMatchObject({
      ok: true,
      message: "Combination qualified.",
    });
    const rows = await t.db
      .select()
      .from(requalificationIntervals)
      .where(eq(requalificationIntervals.partFamilyId, ec.id));
    expect(rows).toMatchObject([
      {
        basis: "Customer PPAP report OFP-PPAP-77",
        intervalMonths: 12,
        lastQualifiedAt: "2026-11-20T00:00:00.000Z",
      },
    ]);
    expect(await qualifyCombinationAction(null, form(fields))).toMatchObject({
      ok: false,
      message: expect.stringMatching(/PF-EC-7 on R-AW3-VB v\d+ is already a qualified combination/),
    });
  });
});

describe("master data files", () => {
  it("imports specifications by CSV and answers each bad line without saving any", async () => {
    await actAs(people.engineer);
    const csv =
      "code,name,customer,document_number,revision,ccc\nCS-IM-1,Rail block,Ostwick Fluid Power,OFP-1,A,A(B-E17/F-G14)\nCS-IM-2,Cover,Ostwick Fluid Power,OFP-2,A,A(B-E17/Z12)\n";
    const file = (text: string) => new File([text], "specs.csv", { type: "text/csv" });
    const bad = form({ kind: "specifications" });
    bad.set("file", file(csv));
    const { request, context } = post("/api/parts/import", bad);
    const refused = await importMasterData(request, context);
    expect(refused.status).toBe(422);
    expect(await refused.json()).toMatchObject({
      ok: false,
      rowErrors: [{ line: 3, message: expect.stringMatching(/at character 9/) }],
    });
    expect(await spec("CS-IM-1")).toBeUndefined();
    const good = new FormData();
    good.set("kind", "specifications");
    good.set("file", file(csv.split("\n").slice(0, 2).join("\n")));
    const again = post("/api/parts/import", good);
    const accepted = await importMasterData(again.request, again.context);
    expect(await accepted.json()).toEqual({ ok: true, message: "1 specification imported." });
    expect(await spec("CS-IM-1")).toMatchObject({
      customer: "Ostwick Fluid Power",
      ccc: "A(B-E17/F-G14)",
    });
  });

  it("exports part families as CSV in the import's columns, and everything as JSON", async () => {
    await actAs(people.auditor);
    const csv = await exportMasterData(
      new NextRequest("http://127.0.0.1/api/parts/export?format=csv&kind=part_families"),
      { params: Promise.resolve({}) },
    );
    expect(csv.headers.get("content-type")).toMatch(/text\/csv/);
    const lines = (await csv.text()).split("\r\n");
    expect(lines[0]).toBe(
      "code,name,part_numbers,material,wetted_area_cm2,wetted_area_method,wetted_area_note,wetted_volume_cm3,drawing_number,drawing_revision,customer,spec_code,spec_revision,description",
    );
    expect(lines.find((l) => l.startsWith("PF-EC-7,"))).toBe(
      "PF-EC-7,End cap EC-7,EC-7-01; EC-7-02,Brass CW614N,64,measured,,,,,,CS-VB-01,Z9,",
    );
    const json = await (
      await exportMasterData(new NextRequest("http://127.0.0.1/api/parts/export?format=json"), {
        params: Promise.resolve({}),
      })
    ).json();
    expect(json.combinations).toContainEqual(
      expect.objectContaining({
        familyCode: "PF-EC-7",
        recipeCode: "R-AW3-VB",
        qualifiedOn: "2026-11-20",
        dueOn: "2027-11-20",
      }),
    );
    expect(
      json.specifications
        .filter((s: { code: string }) => s.code === "CS-VB-01")
        .map((s: { status: string }) => s.status),
    ).toEqual(expect.arrayContaining(["superseded", "in_force"]));
  });

  it("stores a specification's source document by its hash, bound to no run, audited", async () => {
    await actAs(people.engineer);
    const body = new FormData();
    body.set(
      "file",
      new File(
        [new TextEncoder().encode("%PDF-1.7\n% OFP-CL-220 rev A\n%%EOF\n")],
        "OFP-CL-220 rev A.pdf",
        { type: "application/pdf" },
      ),
    );
    const res = await uploadSpecSource(
      new NextRequest("http://127.0.0.1/api/parts/specs/source", { method: "POST", body }),
      { params: Promise.resolve({}) },
    );
    const answer = await res.json();
    expect(answer).toMatchObject({
      ok: true,
      file: { name: "OFP-CL-220 rev A.pdf", sha256: expect.stringMatching(/^[0-9a-f]{64}$/) },
    });
    const [row] = await t.db
      .select()
      .from(evidenceFiles)
      .where(eq(evidenceFiles.id, answer.file.id));
    expect(row).toMatchObject({
      runId: null,
      mimeType: "application/pdf",
      sha256: answer.file.sha256,
    });
    expect(
      (await t.db.select().from(auditEvents).where(eq(auditEvents.recordId, row.id))).map(
        (e) => e.action,
      ),
    ).toEqual(["evidence_file.spec_source_uploaded"]);
  });
});

describe("the register's filter", () => {
  it("finds revisions by status and by a word in code, title, customer or document, wildcards taken literally", async () => {
    const superseded = await listSpecRegister({ status: "superseded", q: "vb-01" });
    expect(superseded.map((s) => `${s.code} ${s.status}`)).toEqual(["CS-VB-01 superseded"]);
    const byCustomer = await listSpecRegister({ status: "in_force", q: "OSTWICK" });
    expect(byCustomer.map((s) => s.code)).toContain("CS-IM-1");
    expect(await listSpecRegister({ status: "all", q: "%" })).toEqual([]);
    expect((await listSpecRegister({ status: "all", q: "" })).length).toBeGreaterThan(
      byCustomer.length,
    );
  });
});
