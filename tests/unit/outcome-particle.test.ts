import { describe, expect, it } from "vitest";
import { checkWord } from "@/lib/evidence/outcomes/common";
import { particleOutcome, type ParticleOutcomeInput } from "@/lib/evidence/outcomes/particle";
import { particleRunDataSchema, particleSampleSchema } from "@/lib/schemas/evidence";

// Check values carry their source and tag as in ../shared/reference/standards.md:
// [std] standard or faithful quotation; [derived] computed from sourced values; [memory] recalled.

// The worked example of ISO 16232's sample report: three parts of 37.35 cm², 112.05 cm² together.
const SPEC = {
  ccc: "A(B-D18/E8/F7/G-H6/I-N00)",
  maxMetallicUm: 400,
  maxNonMetallicUm: null,
  maxFibreUm: null,
  gravimetricLimitMg: null,
  gravimetricBasis: null,
  minWettingTensionMNm: null,
};
const FAMILY = { wettedAreaCm2: 37.35, wettedVolumeCm3: null };
const sample = (label: string, raw: Record<string, unknown>) => ({
  sampleLabel: label,
  worstCase: false,
  data: particleSampleSchema.parse({ sampleLabel: label, largest: {}, ...raw }),
});
const runData = (raw: Record<string, unknown>) =>
  particleRunDataSchema.parse({ extractionSeries: "", blankCounts: {}, ...raw });
const input = (over: Partial<ParticleOutcomeInput>): ParticleOutcomeInput => ({
  family: FAMILY,
  spec: SPEC,
  samples: [],
  runData: null,
  ...over,
});

const worked = sample("P-1", {
  components: "3",
  counts: { E: "14", F: "6", H: "1" },
  largest: { metallicUm: "350" },
});
const qualified = runData({
  extractionSeries: "100, 30, 8",
  blankMeasured: "on",
  blankCounts: { B: "3" },
});

describe("particle cleanliness outcome", () => {
  it("passes the worked example once the blank and the declining test qualify the measurement", () => {
    const out = particleOutcome(input({ samples: [worked], runData: qualified }));
    // [std] ISO 16232 sample report (standards.md §1): E 124.94, F 53.55, H 8.92 per 1000 cm² → E7, F6, H4
    expect(out.code).toMatch(/^A\(.*E7\/F6\/G00\/H4/);
    expect(out.samples[0].lines).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/^E: 124\.9 per 1000 cm² → level 7.*pass$/),
        "Largest metallic particle 350 µm, limit 400 µm: pass",
      ]),
    );
    // [derived] declining test 8 / (100 + 30 + 8) = 5.8 % ≤ 10 % (VDA 19.1 / ISO 16232) at extraction 3
    const extraction = out.checks.find((c) => c.title.includes("extraction"))!;
    expect(extraction).toMatchObject({ kind: "measurement", pass: true });
    expect(extraction.lines.at(-1)).toMatch(/at extraction 3: extraction qualified/);
    expect(out.outcome).toBe("pass");
  });

  it("is incomplete without a blank value, whatever the samples say", () => {
    const out = particleOutcome(input({ samples: [worked], runData: null }));
    expect(out.samples[0].outcome).toBe("pass");
    expect(out.outcome).toBe("incomplete");
    expect(out.missing.join(" ")).toMatch(/No blank value/);
  });

  it("fails a sample above its class limit", () => {
    // [derived] 40 particles in E on 37.35 cm² = 1071 per 1000 cm², far above level 8 (≤ 250) [std] ISO 16232 level table
    const out = particleOutcome(
      input({
        samples: [sample("P-2", { components: "1", counts: { E: "40" } })],
        runData: runData({ blankMeasured: "on" }),
      }),
    );
    expect(out.samples[0].outcome).toBe("fail");
    expect(out.outcome).toBe("fail");
  });

  it("fails a sample whose largest metallic particle exceeds the limit even when the counts pass", () => {
    const big = sample("P-3", {
      components: "3",
      counts: { E: "14" },
      largest: { metallicUm: "450" },
    });
    const out = particleOutcome(input({ samples: [big], runData: qualified }));
    expect(out.samples[0].lines).toContain("Largest metallic particle 450 µm, limit 400 µm: fail");
    expect(out.outcome).toBe("fail");
  });

  it("leaves the run incomplete, not failed, when the extraction has not declined", () => {
    // [derived] 20 / (100 + 40 + 20) = 12.5 % > 10 % [std] VDA 19.1 declining test
    const out = particleOutcome(
      input({
        samples: [worked],
        runData: runData({ extractionSeries: "100, 40, 20", blankMeasured: "on" }),
      }),
    );
    expect(out.checks.find((c) => c.title.includes("extraction"))).toMatchObject({
      kind: "measurement",
      pass: null,
    });
    expect(out.outcome).toBe("incomplete");
  });

  it("leaves the run incomplete, not failed, when the blank is too high: the measurement is not qualified", () => {
    // [std] VDA 19.1: the blank must stay within 10 % of the limit; class I is limited to 00 (none), so 5 particles are too many
    const out = particleOutcome(
      input({
        samples: [worked],
        runData: runData({ blankMeasured: "on", blankCounts: { I: "5" } }),
      }),
    );
    const blank = out.checks.find((c) => c.title.includes("blank"))!;
    expect(blank).toMatchObject({ kind: "measurement", pass: false });
    expect(out.samples[0].outcome).toBe("pass");
    expect(out.outcome).toBe("incomplete");
  });

  it("cannot evaluate a V() specification for a family with no wetted volume", () => {
    const out = particleOutcome(
      input({
        spec: { ...SPEC, ccc: "V(J3/K0/L00/M00/N00)" },
        samples: [worked],
        runData: qualified,
      }),
    );
    expect(out.samples[0]).toMatchObject({ outcome: "incomplete" });
    expect(out.samples[0].lines[0]).toMatch(/no wetted volume/);
    expect(out.outcome).toBe("incomplete");
  });

  it("pools every sample into the run's code", () => {
    const out = particleOutcome(input({ samples: [worked, worked], runData: qualified }));
    // [derived] pooling doubles counts and area alike, so the worked example's levels stay E7/F6/H4
    expect(out.code).toMatch(/E7\/F6\/G00\/H4/);
    expect(out.basisUnit).toMatch(/1000 cm²/);
  });

  it("shows the extraction as “not recorded”, not “Pass”, when no declining test was entered", () => {
    const out = particleOutcome(
      input({
        samples: [worked],
        runData: runData({ blankMeasured: "on", blankCounts: { B: "3" } }),
      }),
    );
    const extraction = out.checks.find((c) => c.title.includes("extraction"))!;
    expect(checkWord(extraction)).toBe("not recorded");
    // A recorded, declined series still reads as a pass.
    const measured = particleOutcome(input({ samples: [worked], runData: qualified })).checks.find(
      (c) => c.title.includes("extraction"),
    )!;
    expect(checkWord(measured)).toBe("pass");
  });
});
