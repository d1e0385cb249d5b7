import { describe, expect, it } from "vitest";
import { assess } from "@/lib/changes/assess";
import type { ParameterSnapshot, RecipeSnapshot } from "@/lib/changes/diff";
import { DEFAULT_MATRIX } from "@/lib/changes/requalification";
import { MATRIX_SUBJECTS, subjectLabel } from "@/lib/recipes/test-types";
import { parameterProblems } from "@/lib/recipes/units";

const p = (
  over: Partial<ParameterSnapshot> & Pick<ParameterSnapshot, "key" | "kind" | "setpoint" | "unit">,
): ParameterSnapshot => ({
  name: over.key,
  validatedLow: null,
  validatedHigh: null,
  critical: true,
  ...over,
});

const recipe = (
  dryingTime: number,
  loadPattern: number,
  notes = "First version.",
): RecipeSnapshot => ({
  detergent: "Alkaline cleaner AC-14",
  notes,
  stages: [
    {
      name: "Wash",
      kind: "wash",
      mode: "ultrasonic",
      parameters: [
        p({
          key: "wash.time",
          kind: "time",
          setpoint: 240,
          unit: "s",
          validatedLow: 180,
          validatedHigh: 300,
        }),
      ],
    },
    {
      name: "Drying",
      kind: "drying",
      mode: "hot_air_drying",
      parameters: [
        p({
          key: "drying.time",
          kind: "time",
          setpoint: dryingTime,
          unit: "s",
          validatedLow: 240,
          validatedHigh: 420,
        }),
      ],
    },
    {
      name: "Loading",
      kind: "other",
      mode: null,
      parameters: [
        p({
          key: "loading.pattern",
          kind: "load_pattern",
          setpoint: loadPattern,
          unit: "pattern no.",
        }),
      ],
    },
  ],
});

const tests = (from: RecipeSnapshot, to: RecipeSnapshot, raisedTo: "major" | null = null) =>
  assess({ from, to, newPartFamily: null, raisedTo, matrix: DEFAULT_MATRIX }).tests.map(
    (t) => t.testType,
  );

describe("the requalification matrix keyed by stage and kind of parameter", () => {
  // The product brief's matrix: drying → dryness and visual; loading → cleanliness at the worst-case position.
  it("halving the drying time calls for a dryness test (and visual), not only particle and gravimetric", () => {
    expect(tests(recipe(300, 1), recipe(150, 1))).toEqual([
      "dryness",
      "gravimetric",
      "particle_cleanliness",
      "visual",
    ]);
  });

  it("a wash time outside its range calls for no dryness test", () => {
    const from = recipe(300, 1);
    const to = {
      ...from,
      stages: from.stages.map((s) =>
        s.kind === "wash"
          ? { ...s, parameters: [{ ...s.parameters[0], setpoint: 100, validatedLow: 90 }] }
          : s,
      ),
    };
    expect(tests(from, to)).toEqual(["gravimetric", "particle_cleanliness"]);
  });

  it("a load-pattern change raised to major calls for particle cleanliness; left minor it calls for none", () => {
    expect(tests(recipe(300, 1), recipe(300, 2))).toEqual([]);
    expect(tests(recipe(300, 1), recipe(300, 2), "major")).toEqual(["particle_cleanliness"]);
  });

  it("stage-specific subjects are offered in the matrix with their own words", () => {
    expect(MATRIX_SUBJECTS).toContain("parameter:drying:time");
    expect(subjectLabel("parameter:drying:time")).toBe("Parameter in a drying stage: time");
    expect(subjectLabel("parameter:time")).toBe("Parameter: time");
  });

  it("load pattern and fixture are whole sheet numbers in their own units", () => {
    expect(
      parameterProblems({
        kind: "load_pattern",
        unit: "pattern no.",
        setpoint: 2,
        validatedLow: null,
        validatedHigh: null,
        stageKind: "other",
      }),
    ).toEqual([]);
    expect(
      parameterProblems({
        kind: "fixture",
        unit: "fixture no.",
        setpoint: 1.5,
        validatedLow: null,
        validatedHigh: null,
        stageKind: "other",
      })[0].message,
    ).toMatch(/whole number/);
    expect(
      parameterProblems({
        kind: "fixture",
        unit: "parts/basket",
        setpoint: 1,
        validatedLow: null,
        validatedHigh: null,
        stageKind: "other",
      })[0].field,
    ).toBe("unit");
  });
});
