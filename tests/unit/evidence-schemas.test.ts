import { describe, expect, it } from "vitest";
import {
  bathRecordSchema,
  conductivitySampleSchema,
  createRunSchema,
  formToObject,
  gravimetricSampleSchema,
  observationSampleSchema,
  particleRunDataSchema,
  particleSampleSchema,
  wettingSampleSchema,
} from "@/lib/schemas/evidence";

const id = { sampleLabel: "VB-0001", basketPosition: "", worstCase: "on" };

describe("particle sample schema", () => {
  it("accepts counts typed into the form, empty classes meaning none", () => {
    const r = particleSampleSchema.parse({
      ...id,
      components: "3",
      counts: { E: "14", F: "6", H: "1", B: "" },
      largest: { metallicUm: "350" },
    });
    expect(r).toMatchObject({
      sampleLabel: "VB-0001",
      worstCase: true,
      components: 3,
      counts: { E: 14, F: 6, H: 1 },
      split: null,
      largest: { metallicUm: 350 },
    });
    expect(r.counts).not.toHaveProperty("B");
  });
  it("refuses negative, fractional and non-numeric counts, naming the class", () => {
    const r = particleSampleSchema.safeParse({
      ...id,
      components: "1",
      counts: { E: "-1", F: "2.5", G: "many" },
      largest: {},
    });
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join("."));
    expect(paths).toEqual(expect.arrayContaining(["counts.E", "counts.F", "counts.G"]));
  });
  it("requires the metallic / non-metallic / fibre split to add up to the total", () => {
    const ok = particleSampleSchema.safeParse({
      ...id,
      components: "1",
      counts: { E: "10" },
      splitMeasured: "on",
      metallic: { E: "4" },
      nonMetallic: { E: "5" },
      fibre: { E: "1" },
      largest: {},
    });
    expect(ok.success && ok.data.split).toEqual({
      metallic: { E: 4 },
      nonMetallic: { E: 5 },
      fibre: { E: 1 },
    });
    const bad = particleSampleSchema.safeParse({
      ...id,
      components: "1",
      counts: { E: "10" },
      splitMeasured: "on",
      metallic: { E: "4" },
      nonMetallic: {},
      fibre: {},
      largest: {},
    });
    expect(bad.error!.issues[0]).toMatchObject({
      path: ["counts", "E"],
      message: expect.stringMatching(/is 4, but the total is 10/),
    });
  });
  it("needs a sample label and at least one component", () => {
    const r = particleSampleSchema.safeParse({
      sampleLabel: " ",
      components: "0",
      counts: {},
      largest: {},
    });
    expect(r.error!.issues.map((i) => i.path[0])).toEqual(
      expect.arrayContaining(["sampleLabel", "components"]),
    );
  });
});

describe("particle run data schema", () => {
  it("reads an extraction series and a blank", () => {
    expect(
      particleRunDataSchema.parse({
        extractionSeries: "100, 30, 8",
        blankMeasured: "on",
        blankCounts: { B: "12" },
        blankLargestUm: "80",
      }),
    ).toEqual({
      extractionSeries: [100, 30, 8],
      blank: { counts: { B: 12 }, largestUm: 80 },
    });
  });
  it("refuses a series that is not numbers, or longer than ten", () => {
    expect(
      particleRunDataSchema.safeParse({ extractionSeries: "100, thirty", blankCounts: {} }).success,
    ).toBe(false);
    expect(
      particleRunDataSchema.safeParse({
        extractionSeries: Array(11).fill("5").join(","),
        blankCounts: {},
      }).success,
    ).toBe(false);
  });
});

describe("other entry schemas", () => {
  it("gravimetry: masses in mg, the filter not lighter after", () => {
    expect(
      gravimetricSampleSchema.parse({
        ...id,
        components: "2",
        filterBeforeMg: "91.42",
        filterAfterMg: "94.63",
      }),
    ).toMatchObject({ filterBeforeMg: 91.42, filterAfterMg: 94.63, components: 2 });
    const bad = gravimetricSampleSchema.safeParse({
      ...id,
      components: "1",
      filterBeforeMg: "95",
      filterAfterMg: "94",
    });
    expect(bad.error!.issues[0].path).toEqual(["filterAfterMg"]);
  });
  it("wetting tension: readings in mN/m within the test-ink range", () => {
    expect(wettingSampleSchema.parse({ ...id, readingsMNm: "38, 40 38.5" }).readingsMNm).toEqual([
      38, 40, 38.5,
    ]);
    expect(wettingSampleSchema.safeParse({ ...id, readingsMNm: "" }).success).toBe(false);
    expect(wettingSampleSchema.safeParse({ ...id, readingsMNm: "12" }).success).toBe(false);
  });
  it("conductivity: µS/cm with a water temperature between 0 and 100 °C", () => {
    expect(
      conductivitySampleSchema.parse({ ...id, measuredUsPerCm: "500", temperatureC: "20" }),
    ).toMatchObject({ measuredUsPerCm: 500, temperatureC: 20 });
    expect(
      conductivitySampleSchema.safeParse({ ...id, measuredUsPerCm: "500", temperatureC: "120" })
        .success,
    ).toBe(false);
    expect(
      conductivitySampleSchema.safeParse({ ...id, measuredUsPerCm: "", temperatureC: "20" })
        .success,
    ).toBe(false);
  });
  it("visual, UV and dryness: a yes or no is required", () => {
    expect(
      observationSampleSchema.parse({ ...id, acceptable: "no", observation: "stain at bore 3" }),
    ).toMatchObject({ acceptable: false });
    expect(observationSampleSchema.safeParse({ ...id }).success).toBe(false);
  });
  it("a run needs its family, recipe version, type, technician, lab and date", () => {
    const r = createRunSchema.safeParse({
      partFamilyId: "x",
      testType: "bogus",
      lab: "",
      performedOn: "1/2/2026",
    });
    expect(r.error!.issues.map((i) => i.path[0]).sort()).toEqual([
      "lab",
      "partFamilyId",
      "performedOn",
      "recipeVersionId",
      "technicianId",
      "testType",
    ]);
  });
  it("a bath entry needs all three particle-counter channels, falling with size", () => {
    const base = { stageId: crypto.randomUUID(), kind: "reading", performedAt: "2026-01-05T08:00" };
    expect(bathRecordSchema.safeParse({ ...base, concentrationPct: "3.1" }).success).toBe(true);
    expect(
      bathRecordSchema.safeParse({ ...base, countPerMl4: "3000" }).error!.issues[0].path,
    ).toEqual(["countPerMl4"]);
    expect(
      bathRecordSchema.safeParse({
        ...base,
        countPerMl4: "300",
        countPerMl6: "500",
        countPerMl14: "7",
      }).error!.issues[0].path,
    ).toEqual(["countPerMl6"]);
    expect(bathRecordSchema.safeParse({ ...base }).success).toBe(false);
  });
});

describe("formToObject", () => {
  it("nests dotted field names", () => {
    const fd = new FormData();
    fd.set("counts.E", "14");
    fd.set("largest.metallicUm", "350");
    fd.set("sampleLabel", "A");
    expect(formToObject(fd)).toEqual({
      counts: { E: "14" },
      largest: { metallicUm: "350" },
      sampleLabel: "A",
    });
  });

  it("ignores names that reach the prototype, and a later nested name replaces a plain value", () => {
    const fd = new FormData();
    fd.append("__proto__.polluted", "yes");
    fd.append("counts.constructor.prototype.polluted", "yes");
    fd.append("runId", "x");
    fd.append("runId.acceptable", "y");
    expect(formToObject(fd)).toEqual({ runId: { acceptable: "y" } });
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});

describe("dates and cycle ids a user can mistype", () => {
  const run = {
    partFamilyId: "7c9e6679-7425-40de-944b-e07fc1f90ae7",
    recipeVersionId: "7c9e6679-7425-40de-944b-e07fc1f90ae8",
    testType: "gravimetric",
    technicianId: "7c9e6679-7425-40de-944b-e07fc1f90ae9",
    lab: "Larchfield cleanliness lab",
  };
  const day = (offsetDays: number) =>
    new Date(Date.now() + offsetDays * 86_400_000).toISOString().slice(0, 10);

  it("refuses a test dated months ahead, and takes today", () => {
    const ahead = createRunSchema.safeParse({ ...run, performedOn: day(90) });
    expect(ahead.error?.issues.map((i) => [i.path[0], i.message])).toEqual([
      ["performedOn", "The test date cannot be in the future."],
    ]);
    expect(createRunSchema.safeParse({ ...run, performedOn: day(0) }).success).toBe(true);
  });

  it("refuses a sample's cycle id that starts with a minus sign", () => {
    const sample = { ...id, components: "1", filterBeforeMg: "91.42", filterAfterMg: "94.63" };
    const bad = gravimetricSampleSchema.safeParse({ ...sample, cycleNumber: "-4" });
    expect(bad.error?.issues.map((i) => i.path[0])).toEqual(["cycleNumber"]);
    expect(
      gravimetricSampleSchema.safeParse({ ...sample, cycleNumber: "AW3-261201-2" }).success,
    ).toBe(true);
  });
});
