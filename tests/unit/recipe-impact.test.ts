import { describe, expect, it } from "vitest";
import { PARAMETER_KINDS, type ParameterKind } from "@/db/enums";
import { diffRecipes, type ParameterSnapshot, type RecipeSnapshot } from "@/lib/changes/diff";
import { UNITS_BY_KIND } from "@/lib/recipes/units";

function param(kind: ParameterKind, over: Partial<ParameterSnapshot> = {}): ParameterSnapshot {
  const unit = UNITS_BY_KIND[kind][0] ?? "rpm";
  return {
    key: `p.${kind}`,
    name: kind,
    kind,
    setpoint: 50,
    unit,
    validatedLow: 40,
    validatedHigh: 60,
    critical: true,
    ...over,
  };
}

function recipe(params: ParameterSnapshot[], over: Partial<RecipeSnapshot> = {}): RecipeSnapshot {
  return {
    detergent: "Alkaline cleaner AC-14",
    notes: "First validated version.",
    stages: [
      { name: "Wash", kind: "wash", mode: "ultrasonic", parameters: params },
      { name: "Drying", kind: "drying", mode: "hot_air_drying", parameters: [] },
    ],
    ...over,
  };
}

describe("impact per parameter kind", () => {
  // Every kind, inside and outside its validated range 40–60 (setpoint 50).
  const cases = PARAMETER_KINDS.flatMap((kind) => [
    { kind, to: 50, impact: "editorial", position: "inside" },
    { kind, to: 55, impact: "minor", position: "inside" },
    { kind, to: 60, impact: "minor", position: "inside" },
    { kind, to: 40, impact: "minor", position: "inside" },
    { kind, to: 61, impact: "major", position: "outside" },
    { kind, to: 39, impact: "major", position: "outside" },
  ]);
  it.each(cases)(
    "$kind setpoint 50 → $to is $impact ($position)",
    ({ kind, to, impact, position }) => {
      const d = diffRecipes(recipe([param(kind)]), recipe([param(kind, { setpoint: to })]));
      expect(d.impact).toBe(impact);
      expect(d.parameters[0].position).toBe(position);
    },
  );
});

describe("impact of ranges, stages, modes, detergent and wording", () => {
  const base = recipe([
    param("temperature"),
    param("time", { setpoint: 240, validatedLow: 180, validatedHigh: 300 }),
  ]);
  const table: { name: string; next: RecipeSnapshot; impact: string; reason: RegExp }[] = [
    { name: "nothing changed", next: base, impact: "editorial", reason: /^$/ },
    {
      name: "wording of the notes only",
      next: { ...base, notes: "First validated version, reworded." },
      impact: "editorial",
      reason: /Wording only/,
    },
    {
      name: "a stage renamed",
      next: {
        ...base,
        stages: base.stages.map((s) => (s.kind === "wash" ? { ...s, name: "Main wash" } : s)),
      },
      impact: "editorial",
      reason: /renamed/,
    },
    {
      name: "range narrowed within the proven range",
      next: recipe([param("temperature", { validatedLow: 45 }), base.stages[0].parameters[1]]),
      impact: "minor",
      reason: /narrowed/,
    },
    {
      name: "range widened at the top",
      next: recipe([param("temperature", { validatedHigh: 70 }), base.stages[0].parameters[1]]),
      impact: "major",
      reason: /widened/,
    },
    {
      name: "range widened at the bottom",
      next: recipe([param("temperature", { validatedLow: 30 }), base.stages[0].parameters[1]]),
      impact: "major",
      reason: /widened/,
    },
    {
      name: "range bound removed",
      next: recipe([param("temperature", { validatedHigh: null }), base.stages[0].parameters[1]]),
      impact: "major",
      reason: /widened/,
    },
    {
      name: "critical flag changed",
      next: recipe([param("temperature", { critical: false }), base.stages[0].parameters[1]]),
      impact: "minor",
      reason: /critical/,
    },
    {
      name: "time in minutes, same value",
      next: recipe([
        param("temperature"),
        param("time", { setpoint: 4, unit: "min", validatedLow: 3, validatedHigh: 5 }),
      ]),
      impact: "editorial",
      reason: /converted/,
    },
    {
      name: "time in minutes, outside",
      next: recipe([
        param("temperature"),
        param("time", { setpoint: 6, unit: "min", validatedLow: 3, validatedHigh: 5 }),
      ]),
      impact: "major",
      reason: /outside/,
    },
    {
      name: "unit changed incomparably",
      next: recipe([param("temperature"), param("time", { unit: "h" })]),
      impact: "major",
      reason: /cannot be compared/,
    },
    {
      name: "a stage added",
      next: {
        ...base,
        stages: [
          ...base.stages,
          { name: "Second rinse", kind: "rinse", mode: "spray", parameters: [] },
        ],
      },
      impact: "major",
      reason: /added/,
    },
    {
      name: "a stage removed",
      next: { ...base, stages: base.stages.filter((s) => s.kind !== "drying") },
      impact: "major",
      reason: /removed/,
    },
    {
      name: "a mode changed",
      next: {
        ...base,
        stages: base.stages.map((s) => (s.kind === "drying" ? { ...s, mode: "vacuum_drying" } : s)),
      },
      impact: "major",
      reason: /hot_air_drying removed, vacuum_drying added/,
    },
    {
      name: "a detergent changed",
      next: { ...base, detergent: "Neutral cleaner NC-7" },
      impact: "major",
      reason: /new detergent/,
    },
    {
      name: "a parameter added",
      next: recipe([...base.stages[0].parameters, param("concentration")]),
      impact: "major",
      reason: /New parameter/,
    },
    {
      name: "a parameter removed",
      next: recipe([base.stages[0].parameters[0]]),
      impact: "major",
      reason: /removed/,
    },
  ];
  it.each(table)("$name → $impact", ({ next, impact, reason }) => {
    const d = diffRecipes(base, next);
    expect(d.impact).toBe(impact);
    const reasons = [
      ...d.parameters.flatMap((p) => p.reasons),
      ...d.stages.map((s) => s.reason),
      ...d.texts.map((t) => t.reason),
    ].join(" ");
    expect(reasons).toMatch(reason);
  });

  it("takes the highest class over all rows: one major among minors makes the change major", () => {
    const next = recipe([
      param("temperature", { setpoint: 55 }),
      param("time", { setpoint: 400, validatedLow: 180, validatedHigh: 300 }),
    ]);
    const d = diffRecipes(base, next);
    expect(d.parameters.map((p) => p.impact)).toEqual(["minor", "major"]);
    expect(d.impact).toBe("major");
  });

  it("gives free-text fields a word diff", () => {
    const d = diffRecipes(base, { ...base, detergent: "Neutral cleaner AC-14" });
    expect(d.texts[0].parts.filter((p) => p.removed).map((p) => p.value.trim())).toEqual([
      "Alkaline",
    ]);
    expect(d.texts[0].parts.filter((p) => p.added).map((p) => p.value.trim())).toEqual(["Neutral"]);
  });
});
