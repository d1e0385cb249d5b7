import { execFileSync } from "node:child_process";
import { deflateSync } from "node:zlib";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seed";
import {
  auditEvents,
  cleanlinessSpecs,
  partFamilies,
  recipeVersions,
  testRunLabDetails,
  users,
} from "@/db/schema";
import { verifyAuditChain } from "@/lib/audit";
import { particleSampleSchema } from "@/lib/schemas/evidence";
import { labDetailsSchema } from "@/lib/schemas/lab-details";
import { addSample } from "@/lib/server/evidence/add-sample";
import { createRun } from "@/lib/server/evidence/create-run";
import { computeStoredOutcome } from "@/lib/server/evidence/refresh-outcome";
import { reviseRun } from "@/lib/server/evidence/revise-run";
import { getRunRow, runContent } from "@/lib/server/evidence/run-content";
import { exportTestReport } from "@/lib/server/lab-report/export-test-report";
import { getLabDetails } from "@/lib/server/lab-report/lab-details";
import { saveLabDetails } from "@/lib/server/lab-report/save-lab-details";
import { loadTestReport } from "@/lib/server/lab-report/test-report";
import { storeEvidenceFile } from "@/lib/server/evidence/store-file";
import { qualifyCombination } from "@/lib/server/plant/qualify-combination";
import { localStore, setStore } from "@/lib/storage";
import * as labDetailsRoute from "@/app/api/v1/test-runs/[runId]/lab-details/route";
import * as reportRoute from "@/app/api/v1/test-runs/[runId]/report/route";
import { createApiToken } from "@/lib/server/api-tokens/create-api-token";
import { createTestDatabase } from "./support/test-db";

let t: Awaited<ReturnType<typeof createTestDatabase>>;
const storeDir = mkdtempSync(join(tmpdir(), "washproof-test-report-"));
type Person = { id: string; name: string };
let tech: Person;
let engineer: Person;
let familyId: string;
let versionId: string;
let demoRunId: string;
/** The demo run's report as pdftotext reads it, whitespace folded. */
let text = "";

const form = (over: Record<string, unknown> = {}) => ({
  component: {
    drawingRevision: "D-T rev. A",
    lot: "LOT-7",
    wettedAreaCm2: "37.35",
    wettedAreaMethod: "calculated",
  },
  extraction: {
    procedure: "pressure_rinsing",
    liquid: "Filtered cold cleaner",
    volumeMl: "1000",
    pressureBar: "2.5",
    durationS: "60",
    controlledSurface: "All external surfaces",
    extractions: "3",
  },
  filter: { material: "PET mesh", poreSizeUm: "5" },
  analysis: { system: "light_microscope_manual", magnification: "50", lowerSizeLimitUm: "50" },
  largest: { metallic: {}, nonMetallic: {}, fibre: {} },
  ...over,
});

beforeAll(async () => {
  setStore(localStore(storeDir));
  t = await createTestDatabase();
  await seedDemo(t.db);
  const byEmail = async (email: string) =>
    (
      await t.db
        .select({ id: users.id, name: users.name })
        .from(users)
        .where(eq(users.email, email))
    )[0];
  tech = await byEmail("technician@fennmoor.example");
  engineer = await byEmail("engineer@fennmoor.example");
  const [spec] = await t.db
    .insert(cleanlinessSpecs)
    .values({ code: "CS-LAB", name: "Lab test spec", ccc: "A(B-D18/E8/F7/G-H6/I-N00)" })
    .returning();
  const [family] = await t.db
    .insert(partFamilies)
    .values({
      code: "PF-LAB",
      name: "Lab part",
      material: "Al",
      wettedAreaCm2: 37.35,
      specId: spec.id,
    })
    .returning();
  familyId = family.id;
  versionId = (await t.db.select().from(recipeVersions).limit(1))[0].id;
  await qualifyCombination(engineer, {
    recipeVersionId: versionId,
    partFamilyId: familyId,
    basis: "Test qualification",
    qualifiedOn: "2026-01-05",
    intervalMonths: 12,
  });

  [{ runId: demoRunId }] = await t.db
    .select({ runId: testRunLabDetails.runId })
    .from(testRunLabDetails);
  const pdf = await exportTestReport(engineer, demoRunId);
  const dir = mkdtempSync(join(tmpdir(), "washproof-report-"));
  writeFileSync(join(dir, "report.pdf"), pdf!.bytes);
  if (process.env.DUMP_REPORT) writeFileSync(process.env.DUMP_REPORT, pdf!.bytes);
  text = execFileSync("pdftotext", ["-raw", join(dir, "report.pdf"), "-"], {
    encoding: "utf8",
  }).replace(/\s+/g, " ");
  rmSync(dir, { recursive: true, force: true });
}, 120_000);
afterAll(() => {
  setStore(undefined);
  t.cleanup();
  rmSync(storeDir, { recursive: true, force: true });
});

/** A real 2 × 2 grey PNG, built here so the test needs no file on disk. */
function png(): Uint8Array {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    return c >>> 0;
  });
  const crc = (buf: Buffer) => {
    let c = 0xffffffff;
    for (const b of buf) c = crcTable[(c ^ b) & 0xff] ^ (c >>> 8);
    return (c ^ 0xffffffff) >>> 0;
  };
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(data.length);
    const body = Buffer.concat([Buffer.from(type, "ascii"), data]);
    const sum = Buffer.alloc(4);
    sum.writeUInt32BE(crc(body));
    return Buffer.concat([len, body, sum]);
  };
  const header = Buffer.alloc(13);
  header.writeUInt32BE(2, 0);
  header.writeUInt32BE(2, 4);
  header[8] = 8; // bit depth
  header[9] = 0; // greyscale
  const pixels = Buffer.from([0, 90, 160, 0, 200, 30]);
  return new Uint8Array(
    Buffer.concat([
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
      chunk("IHDR", header),
      chunk("IDAT", deflateSync(pixels)),
      chunk("IEND", Buffer.alloc(0)),
    ]),
  );
}

const newRun = () =>
  createRun(engineer, {
    partFamilyId: familyId,
    recipeVersionId: versionId,
    testType: "particle_cleanliness",
    technicianId: tech.id,
    lab: "Lab",
    performedOn: "2026-03-02",
  });

describe("the test report PDF of the demo's verified valve-body run (pdftotext)", () => {
  it("names company and site, the component, its drawing revision, lot, count and wetted area with its method", () => {
    expect(text).toContain("Fennmoor");
    expect(text).toContain("Larchfield");
    for (const field of [
      "Valve body",
      "VB-210-01",
      "D-VB-210 · F",
      "L-2026-0207-3",
      "Number of components 3",
      "Wetted area per component 420 cm²",
      "Wetted area determined From the CAD model",
    ])
      expect(text).toContain(field);
  });

  it("carries the extraction, its parameters, the filter and the analysis system", () => {
    for (const field of [
      "Pressure rinsing",
      "Filtered neutral aqueous cleaner",
      "1,500 mL",
      "3 bar",
      "90 s",
      "All wetted internal bores",
      "PET mesh, pore size 5 µm",
      "Light microscope, automated",
      "50×",
      "Lower size limit 5 µm",
    ])
      expect(text).toContain(field);
  });

  it("gives the blank and its evaluation, the declining test, counts absolute and normalised, and the code", () => {
    expect(text).toMatch(/Blank counts: B 150, C 40, D 12, E 2/);
    expect(text).toMatch(/it is not subtracted from the result/);
    // Decay value after extraction 3: 68 / (1520 + 270 + 68) = 3.7 % [std, VDA 19.1 declining test; derived]
    expect(text).toMatch(/decay value 3\.7 %/);
    expect(text).toContain("Normalised (per 1000 cm²)");
    // Class B over three parts: 4300 + 3900 + 4450 = 12650 absolute; × 1000 / 1260 cm² = 10039.7 [derived]
    expect(text).toMatch(/B 5–15 µm 12650 10039\.7/);
    expect(text).toMatch(/Cleanliness code A\(B\d+\/C\d+/);
  });

  it("lists the largest particles by type with length, width and the spec's limit, and the type split", () => {
    expect(text).toMatch(
      /Length 370 µm · width 120 µm · sample VB210-260210-3 · limit 400 µm: within/,
    );
    expect(text).toMatch(/Length 760 µm · width 18 µm/);
    expect(text).toMatch(/metallic \(reflective\) \d+, non-metallic \d+, fibres 6/);
  });

  it("evaluates against the specification revision in force, lists deviations and the signatures with the hash", async () => {
    const report = (await loadTestReport(demoRunId))!;
    expect(text).toContain("CS-VB-01 revision C");
    expect(text).toMatch(/Result Pass/);
    expect(text).toContain("Gravimetric residue Not determined in this run.");
    expect(text).toContain("10. Deviations");
    expect(text).toMatch(/Performed by .+I performed this test as recorded/);
    expect(text).toMatch(/Verified by .+I have checked the recorded data/);
    expect(text).toContain(report.run.contentHash);
    expect(report.signatures.every((s) => s.validity === "valid")).toBe(true);
  });

  it("is a controlled copy with page X of Y, and the export is audited", async () => {
    expect(text).toContain("CONTROLLED COPY");
    expect(text).not.toContain("UNCONTROLLED");
    expect(text).toMatch(/Page 1 of \d/);
    const events = await t.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.action, "test_run.report_exported"));
    expect(events.length).toBeGreaterThan(0);
    expect((await verifyAuditChain(t.db)).ok).toBe(true);
  });
});

describe("lab details on a run", () => {
  it("refuses a magnification of zero and a width above the length, naming the field", () => {
    const zero = labDetailsSchema.safeParse(
      form({ analysis: { system: "sem_edx", magnification: "0", lowerSizeLimitUm: "50" } }),
    );
    expect(zero.success).toBe(false);
    expect(zero.error!.issues.map((i) => i.path.join("."))).toContain("analysis.magnification");
    const wide = labDetailsSchema.safeParse(
      form({
        largest: { metallic: { lengthUm: "100", widthUm: "150" }, nonMetallic: {}, fibre: {} },
      }),
    );
    expect(wide.error!.issues.map((i) => i.path.join("."))).toContain("largest.metallic.widthUm");
    const noPressure = labDetailsSchema.safeParse(
      form({
        extraction: { ...form().extraction, pressureBar: "" },
      }),
    );
    expect(noPressure.error!.issues.map((i) => i.path.join("."))).toContain(
      "extraction.pressureBar",
    );
  });

  it("refuses a lower size limit above a class that was counted, naming the lower size limit", async () => {
    const run = await newRun();
    await addSample(tech, {
      runId: run.id,
      sample: particleSampleSchema.parse({
        sampleLabel: "L-1",
        components: "1",
        counts: { D: "40", E: "9" },
        largest: {},
      }),
    });
    await expect(
      saveLabDetails(tech, { runId: run.id, details: labDetailsSchema.parse(form()) }),
    ).rejects.toMatchObject({ field: "analysis.lowerSizeLimitUm" });
    expect(await getLabDetails(t.db, run.id)).toBeNull();
  });

  it("is part of the signed content, shows classes below the limit as not analysed, and refuses counts there", async () => {
    const run = await newRun();
    await addSample(tech, {
      runId: run.id,
      sample: particleSampleSchema.parse({
        sampleLabel: "L-2",
        components: "1",
        counts: { E: "9", F: "2" },
        largest: {},
      }),
    });
    const before = (await runContent(t.db, (await getRunRow(t.db, run.id))!)).hash;
    await saveLabDetails(tech, { runId: run.id, details: labDetailsSchema.parse(form()) });
    const after = (await runContent(t.db, (await getRunRow(t.db, run.id))!)).hash;
    expect(after).not.toBe(before);

    const outcome = await computeStoredOutcome(t.db, (await getRunRow(t.db, run.id))!);
    // Lower size limit 50 µm: B, C, D not analysed, so the code starts at E [std, ISO 16232 size classes: D is 25–50 µm]
    expect(outcome.code).toMatch(/^A\(E\d+\/F\d+\/G00/);
    expect(outcome.code).not.toMatch(/[BCD]\d/);
    // The spec limits B-D: not analysed is not a pass.
    expect(outcome.samples[0].outcome).toBe("incomplete");
    expect(outcome.samples[0].lines.join("\n")).toMatch(/Classes B, C, D: not analysed/);

    await expect(
      addSample(tech, {
        runId: run.id,
        sample: particleSampleSchema.parse({
          sampleLabel: "L-3",
          components: "1",
          counts: { C: "5", E: "1" },
          largest: {},
        }),
      }),
    ).rejects.toMatchObject({ field: "counts.C" });

    const report = (await loadTestReport(run.id))!;
    expect(report.controlled).toBe(false);
    expect(report.particles!.rows.filter((r) => !r.analysed).map((r) => r.key)).toEqual([
      "B",
      "C",
      "D",
    ]);
    expect(report.particles!.rows.find((r) => r.key === "B")!.absolute).toBeNull();
  });

  it("prints the photo of a largest particle inside the report", async () => {
    const run = await newRun();
    await addSample(tech, {
      runId: run.id,
      sample: particleSampleSchema.parse({
        sampleLabel: "L-9",
        components: "1",
        counts: { E: "9", H: "1" },
        largest: { metallicUm: "310" },
      }),
    });
    const { file: photo } = await storeEvidenceFile(tech, {
      runId: run.id,
      name: "largest-metallic.png",
      bytes: png(),
      kind: "photo",
    });
    await saveLabDetails(tech, {
      runId: run.id,
      details: labDetailsSchema.parse(
        form({
          largest: {
            metallic: { lengthUm: "310", widthUm: "95", sampleLabel: "L-9", photoFileId: photo.id },
            nonMetallic: {},
            fibre: {},
          },
        }),
      ),
    });
    const report = (await loadTestReport(run.id))!;
    expect(report.largest[0].photo).toMatchObject({ name: "largest-metallic.png" });
    expect(report.largest[0].photo!.dataUri).toMatch(/^data:image\/png;base64,/);
    const pdf = (await exportTestReport(engineer, run.id))!;
    const dir = mkdtempSync(join(tmpdir(), "washproof-report-photo-"));
    writeFileSync(join(dir, "r.pdf"), pdf.bytes);
    const out = execFileSync("pdftotext", ["-raw", join(dir, "r.pdf"), "-"], { encoding: "utf8" });
    const images = execFileSync("pdfimages", ["-list", join(dir, "r.pdf")], { encoding: "utf8" });
    rmSync(dir, { recursive: true, force: true });
    expect(out.replace(/\s+/g, " ")).toContain("Photo largest-metallic.png");
    expect(out).toContain("UNCONTROLLED COPY");
    // One image in the file: the photo itself, 2 × 2 pixels.
    expect(images.split("\n").filter((l) => /^\s+\d+\s+\d+\s+image/.test(l))).toHaveLength(1);
    // A photo of another run is refused, naming the field.
    const other = await newRun();
    await expect(
      saveLabDetails(tech, {
        runId: other.id,
        details: labDetailsSchema.parse(
          form({
            analysis: { system: "sem_edx", magnification: "100", lowerSizeLimitUm: "5" },
            largest: {
              metallic: { lengthUm: "310", photoFileId: photo.id },
              nonMetallic: {},
              fibre: {},
            },
          }),
        ),
      }),
    ).rejects.toMatchObject({ field: "largest.metallic.photoFileId" });
  });

  it("is recorded through /api/v1 with the same schema, and the report is served as a PDF", async () => {
    const run = await newRun();
    const { token } = await createApiToken(tech, { name: "LIMS", scope: "read_write" });
    const body = {
      component: {
        drawingRevision: "B",
        lot: "LOT-9",
        wettedAreaCm2: 37.35,
        wettedAreaMethod: "measured",
      },
      extraction: {
        procedure: "ultrasonic",
        liquid: "Neutral cleaner",
        volumeMl: 800,
        durationS: 120,
        controlledSurface: "Whole part",
        extractions: 2,
      },
      filter: { material: "Cellulose nitrate", poreSizeUm: 8 },
      analysis: { system: "sem_edx", magnification: 0, lowerSizeLimitUm: 15 },
      largest: { metallic: {}, nonMetallic: {}, fibre: {} },
    };
    const send = (b: unknown) =>
      labDetailsRoute.POST(
        new Request(`http://127.0.0.1/api/v1/test-runs/${run.id}/lab-details`, {
          method: "POST",
          headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
          body: JSON.stringify(b),
        }),
        { params: Promise.resolve({ runId: run.id }) },
      );
    const refused = await send(body);
    expect(refused.status).toBe(422);
    expect((await refused.json()).fieldErrors).toHaveProperty(["analysis.magnification"]);
    expect(await getLabDetails(t.db, run.id)).toBeNull();

    const saved = await send({ ...body, analysis: { ...body.analysis, magnification: 200 } });
    expect(saved.status).toBe(200);
    expect((await saved.json()).labDetails).toMatchObject({
      analysis: { magnification: 200, lowerSizeLimitUm: 15 },
    });

    const pdf = await reportRoute.GET(
      new Request(`http://127.0.0.1/api/v1/test-runs/${run.id}/report`, {
        headers: { authorization: `Bearer ${token}` },
      }),
      { params: Promise.resolve({ runId: run.id }) },
    );
    expect(pdf.status).toBe(200);
    expect(pdf.headers.get("content-type")).toBe("application/pdf");
    expect(
      Buffer.from(await pdf.arrayBuffer())
        .subarray(0, 5)
        .toString(),
    ).toBe("%PDF-");
  });

  it("travels with a new revision of the run", async () => {
    const [demo] = await t.db
      .select()
      .from(testRunLabDetails)
      .where(eq(testRunLabDetails.runId, demoRunId));
    const next = await reviseRun(engineer, {
      runId: demoRunId,
      reason: "Lot number typed wrongly",
    });
    expect(await getLabDetails(t.db, next.id)).toEqual(demo.details);
  });
});
