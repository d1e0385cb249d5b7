import { describe, expect, it } from "vitest";
import {
  analysisMethodProblems,
  citedLowerLimitProblem,
  extractionMethodProblems,
  gravimetricMethodProblems,
} from "@/lib/lab-methods/rules";
import { labDetailsFromMethods } from "@/lib/lab-methods/prefill";
import { labMethodSchema } from "@/lib/schemas/lab-method";

const lightMicroscope = {
  filterMaterial: "PET mesh",
  poreSizeUm: 5,
  system: "light_microscope_automated" as const,
  magnification: 50,
  lowerSizeLimitUm: 15,
  distinguishes: ["reflective", "non_reflective", "fibre"] as const,
};

describe("analysis method fields", () => {
  it("takes a light microscope that tells reflective, non-reflective and fibre apart", () => {
    expect(analysisMethodProblems(lightMicroscope)).toEqual([]);
  });
  it("refuses 'metallic' without SEM/EDX, naming the field [std, ISO 16232: light microscopy tells particles apart by lustre, not material]", () => {
    const problems = analysisMethodProblems({
      ...lightMicroscope,
      distinguishes: ["reflective", "metallic"],
    });
    expect(problems.map((p) => p.field)).toEqual(["details.distinguishes"]);
    expect(problems[0].message).toMatch(/Only SEM\/EDX/);
  });
  it("takes 'metallic' with SEM/EDX", () => {
    expect(
      analysisMethodProblems({
        ...lightMicroscope,
        system: "sem_edx",
        distinguishes: ["metallic"],
      }),
    ).toEqual([]);
  });
  it("refuses a magnification of 0, naming the field", () => {
    const problems = analysisMethodProblems({ ...lightMicroscope, magnification: 0 });
    expect(problems.map((p) => p.field)).toEqual(["details.magnification"]);
  });
  it("refuses a pore size above the lower size limit, takes one equal to it [practice]", () => {
    const problems = analysisMethodProblems({ ...lightMicroscope, poreSizeUm: 20 });
    expect(problems.map((p) => p.field)).toEqual(["details.poreSizeUm"]);
    expect(analysisMethodProblems({ ...lightMicroscope, poreSizeUm: 15 })).toEqual([]);
  });
  it("reports through the form schema under the field's path", () => {
    const parsed = labMethodSchema.safeParse({
      kind: "analysis",
      code: "AN-09",
      name: "Membrane analysis",
      trainingIntervalMonths: "24",
      details: { ...lightMicroscope, magnification: "0", distinguishes: ["metallic"] },
    });
    expect(parsed.success).toBe(false);
    const paths = parsed.error!.issues.map((i) => i.path.join("."));
    expect(paths).toContain("details.magnification");
    expect(paths).toContain("details.distinguishes");
  });
});

describe("extraction and gravimetric method fields", () => {
  it("asks pressure and flow of pressure rinsing [std, ISO 16232 extraction parameters]", () => {
    const problems = extractionMethodProblems({
      procedure: "pressure_rinsing",
      pressureBar: null,
      flowLPerMin: null,
    });
    expect(problems.map((p) => p.field)).toEqual(["details.pressureBar", "details.flowLPerMin"]);
    expect(
      extractionMethodProblems({ procedure: "ultrasonic", pressureBar: null, flowLPerMin: null }),
    ).toEqual([]);
  });
  it("asks a balance of 0.1 mg or finer and a lower limit of ten times it [std, ISO 16232 gravimetry: resolution ≥ 0.1 mg, meaningful from about 1 mg]", () => {
    expect(
      gravimetricMethodProblems({ balanceResolutionMg: 0.1, practicalLowerLimitMg: 1 }),
    ).toEqual([]);
    expect(
      gravimetricMethodProblems({ balanceResolutionMg: 1, practicalLowerLimitMg: 10 }).map(
        (p) => p.field,
      ),
    ).toEqual(["details.balanceResolutionMg"]);
    expect(
      gravimetricMethodProblems({ balanceResolutionMg: 0.1, practicalLowerLimitMg: 0.5 }).map(
        (p) => p.field,
      ),
    ).toEqual(["details.practicalLowerLimitMg"]);
  });
});

describe("citing an analysis method against the classes counted", () => {
  // Class D is 25–50 µm, class E 50–100 µm [std, ISO 16232:2018 Table size classes].
  it("refuses a lower size limit above a class that was counted, naming the field", () => {
    const problem = citedLowerLimitProblem(
      [{ label: "Sample VB-1", counts: { D: 12, E: 3 } }],
      50,
      "analysis",
    );
    expect(problem?.field).toBe("analysis");
    expect(problem?.message).toContain("class D (25–50 µm)");
  });
  it("takes a limit at a counted class's lower bound", () => {
    expect(
      citedLowerLimitProblem([{ label: "Sample VB-1", counts: { E: 3, F: 1 } }], 50, "analysis"),
    ).toBeNull();
  });
});

describe("lab details prefilled from the cited methods", () => {
  it("copies the extraction parameters, the filter and the analysis system", () => {
    const prefill = labDetailsFromMethods([
      {
        kind: "extraction",
        details: {
          procedure: "pressure_rinsing",
          liquid: "Filtered cleaner",
          volumeMl: 1500,
          pressureBar: 4,
          flowLPerMin: 1.5,
          durationS: 90,
          controlledSurface: "All wetted surfaces",
          extractions: 3,
        },
      },
      { kind: "analysis", details: lightMicroscope },
    ]);
    expect(prefill.extraction?.volumeMl).toBe(1500);
    expect(prefill.filter).toEqual({ material: "PET mesh", poreSizeUm: 5 });
    expect(prefill.analysis).toEqual({
      system: "light_microscope_automated",
      magnification: 50,
      lowerSizeLimitUm: 15,
    });
  });
});
