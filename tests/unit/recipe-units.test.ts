import { describe, expect, it } from "vitest";
import { PARAMETER_KINDS } from "@/db/enums";
import { hazardsOfParameters, hazardsOfStages } from "@/lib/recipes/hazards";
import {
  parameterProblems,
  unitFits,
  UNITS_BY_KIND,
  type ParameterCheckInput,
} from "@/lib/recipes/units";

const ok = (over: Partial<ParameterCheckInput>): ParameterCheckInput => ({
  kind: "temperature",
  unit: "°C",
  setpoint: 60,
  validatedLow: 50,
  validatedHigh: 65,
  stageKind: "wash",
  ...over,
});

describe("units per parameter kind", () => {
  it.each(PARAMETER_KINDS.filter((k) => k !== "other"))(
    "%s accepts its own units and refuses a foreign one",
    (kind) => {
      for (const unit of UNITS_BY_KIND[kind]) expect(unitFits(kind, unit)).toBe(true);
      expect(unitFits(kind, kind === "spray_pressure" ? "°C" : "bar")).toBe(false);
    },
  );
  it("other accepts any unit that is given", () => {
    expect(unitFits("other", "rpm")).toBe(true);
    expect(unitFits("other", " ")).toBe(false);
  });
});

describe("physically impossible values", () => {
  const table: {
    name: string;
    input: ParameterCheckInput;
    field: string | null;
    message?: RegExp;
  }[] = [
    { name: "a good wash temperature", input: ok({}), field: null },
    {
      name: "an open aqueous bath above 100 °C",
      input: ok({ setpoint: 105 }),
      field: "setpoint",
      message: /boils at about 100 °C/,
    },
    {
      name: "a rinse range reaching above 100 °C",
      input: ok({ stageKind: "rinse", validatedHigh: 110 }),
      field: "validatedHigh",
      message: /boils/,
    },
    {
      name: "a bath below freezing",
      input: ok({ setpoint: -5, validatedLow: -10 }),
      field: "setpoint",
      message: /freezes/,
    },
    {
      name: "a hot-air dryer at 120 °C",
      input: ok({
        kind: "drying_temperature",
        stageKind: "drying",
        setpoint: 120,
        validatedLow: 110,
        validatedHigh: 130,
      }),
      field: null,
    },
    {
      name: "a negative wash time",
      input: ok({ kind: "time", unit: "s", setpoint: -30, validatedLow: 10, validatedHigh: 60 }),
      field: "setpoint",
      message: /cannot be negative/,
    },
    {
      name: "a negative validated low time",
      input: ok({ kind: "time", unit: "min", setpoint: 3, validatedLow: -1, validatedHigh: 5 }),
      field: "validatedLow",
      message: /negative/,
    },
    {
      name: "a validated low above its high",
      input: ok({ validatedLow: 70, validatedHigh: 60, setpoint: 65 }),
      field: "validatedLow",
      message: /above the validated high/,
    },
    {
      name: "a concentration over 100 %",
      input: ok({
        kind: "concentration",
        unit: "%",
        setpoint: 120,
        validatedLow: 1,
        validatedHigh: 5,
      }),
      field: "setpoint",
      message: /100 %/,
    },
    {
      name: "a vacuum above atmospheric pressure",
      input: ok({
        kind: "vacuum_pressure",
        unit: "mbar",
        stageKind: "drying",
        setpoint: 1500,
        validatedLow: 10,
        validatedHigh: 50,
      }),
      field: "setpoint",
      message: /1013 mbar/,
    },
    {
      name: "half a part per basket",
      input: ok({
        kind: "basket_loading",
        unit: "parts/basket",
        stageKind: "other",
        setpoint: 12.5,
        validatedLow: 1,
        validatedHigh: 24,
      }),
      field: "setpoint",
      message: /whole number/,
    },
    {
      name: "a unit that does not fit the kind",
      input: ok({ unit: "bar" }),
      field: "unit",
      message: /°C, not "bar"/,
    },
    {
      name: "a time in degrees",
      input: ok({ kind: "time", unit: "°C" }),
      field: "unit",
      message: /s or min/,
    },
  ];
  it.each(table)("$name", ({ input, field, message }) => {
    const problems = parameterProblems(input);
    if (field === null) return expect(problems).toEqual([]);
    expect(problems.map((p) => p.field)).toContain(field);
    expect(problems.find((p) => p.field === field)!.message).toMatch(message!);
  });
});

describe("cautions", () => {
  it("names the scald of a hot bath and the dry-heat burn of a dryer apart, each with its hottest temperature", () => {
    // [practice] hot water and steam scald above about 50 °C; a dryer's air and parts burn by contact (dry heat)
    const h = hazardsOfParameters([
      { kind: "temperature", setpoint: 45, unit: "°C", validatedHigh: 55 },
      { kind: "drying_temperature", setpoint: 110, unit: "°C", validatedHigh: 120 },
    ]);
    expect(h.map((x) => x.kind)).toEqual(["burn", "dry_heat"]);
    expect(h[0].text).toMatch(/up to 55 °C: the water and its steam scald/);
    expect(h[1].text).toMatch(/up to 120 °C: .*dry-heat contact burn/);
    expect(h[1].text).not.toMatch(/scald/);
  });
  it("names spray and injection pressure with the highest setpoint", () => {
    const h = hazardsOfStages([
      {
        mode: "spray",
        parameters: [{ kind: "spray_pressure", setpoint: 4, unit: "bar", validatedHigh: 6 }],
      },
      { mode: "injection", parameters: [] },
    ]);
    expect(h.map((x) => x.kind)).toEqual(["pressure"]);
    expect(h[0].text).toMatch(/^Jets here run up to 6 bar\./);
  });
  it("stays quiet for a cool rinse and names chemical, hot parts, noise and isolation where they apply", () => {
    expect(
      hazardsOfParameters([{ kind: "temperature", setpoint: 30, unit: "°C", validatedHigh: 40 }]),
    ).toEqual([]);
    const h = hazardsOfStages([
      { mode: "ultrasonic", parameters: [{ kind: "concentration", setpoint: 3, unit: "%" }] },
      { mode: "vacuum_drying", parameters: [] },
      { mode: null, parameters: [{ kind: "filter_interval", setpoint: 160, unit: "h" }] },
    ]);
    expect(h.map((x) => x.kind).sort()).toEqual(["chemical", "hot_parts", "isolation", "noise"]);
  });
});
