import { describe, expect, it } from "vitest";
import type { ParameterKind } from "@/db/enums";
import { ownRangeProblem, parameterProblems } from "@/lib/recipes/units";

const check = (kind: ParameterKind, unit: string, setpoint: number, stageKind = "wash") =>
  parameterProblems({ kind, unit, setpoint, validatedLow: null, validatedHigh: null, stageKind });

/**
 * Each kind's physical limits, both ways: the largest plausible value passes, the next one up is
 * refused, and so is a value below the lower limit. Upper bounds [practice] as lib/recipes/units.ts
 * gives them; lower bounds physical (no negative time, pressure or concentration; ice below 0 °C).
 */
const cases: {
  kind: ParameterKind;
  unit: string;
  stage?: string;
  lowestOk: number;
  belowLow: number;
  highestOk: number;
  aboveHigh: number;
}[] = [
  { kind: "temperature", unit: "°C", lowestOk: 0, belowLow: -1, highestOk: 100, aboveHigh: 101 },
  {
    kind: "drying_temperature",
    unit: "°C",
    stage: "drying",
    lowestOk: 0,
    belowLow: -1,
    highestOk: 200,
    aboveHigh: 1e9,
  },
  { kind: "time", unit: "s", lowestOk: 0, belowLow: -1, highestOk: 86_400, aboveHigh: 86_401 },
  { kind: "time", unit: "min", lowestOk: 0, belowLow: -0.5, highestOk: 1_440, aboveHigh: 1_441 },
  {
    kind: "concentration",
    unit: "%",
    lowestOk: 0,
    belowLow: -0.1,
    highestOk: 100,
    aboveHigh: 100.5,
  },
  {
    kind: "concentration",
    unit: "g/L",
    lowestOk: 0,
    belowLow: -1,
    highestOk: 1_000,
    aboveHigh: 1_001,
  },
  {
    kind: "ultrasonic_power",
    unit: "W/L",
    lowestOk: 0,
    belowLow: -1,
    highestOk: 100,
    aboveHigh: 101,
  },
  {
    kind: "ultrasonic_frequency",
    unit: "kHz",
    lowestOk: 20,
    belowLow: 10,
    highestOk: 400,
    aboveHigh: 401,
  },
  {
    kind: "spray_pressure",
    unit: "bar",
    lowestOk: 0,
    belowLow: -1,
    highestOk: 1_000,
    aboveHigh: 1_001,
  },
  { kind: "flow", unit: "L/min", lowestOk: 0, belowLow: -1, highestOk: 10_000, aboveHigh: 10_001 },
  {
    kind: "conductivity_limit",
    unit: "µS/cm",
    stage: "final_rinse",
    lowestOk: 0,
    belowLow: -1,
    highestOk: 10_000,
    aboveHigh: 10_001,
  },
  {
    kind: "vacuum_pressure",
    unit: "mbar",
    stage: "drying",
    lowestOk: 0,
    belowLow: -1,
    highestOk: 1_013,
    aboveHigh: 1_014,
  },
  {
    kind: "basket_loading",
    unit: "parts/basket",
    stage: "other",
    lowestOk: 1,
    belowLow: 0,
    highestOk: 100_000,
    aboveHigh: 100_001,
  },
  {
    kind: "filter_interval",
    unit: "h",
    stage: "other",
    lowestOk: 1,
    belowLow: 0,
    highestOk: 8_760,
    aboveHigh: 8_761,
  },
];

describe("physical limits of each parameter kind, both ways", () => {
  it.each(cases)(
    "$kind in $unit: $lowestOk…$highestOk pass, $belowLow and $aboveHigh are refused",
    ({ kind, unit, stage, lowestOk, belowLow, highestOk, aboveHigh }) => {
      expect(check(kind, unit, lowestOk, stage)).toEqual([]);
      expect(check(kind, unit, highestOk, stage)).toEqual([]);
      expect(check(kind, unit, belowLow, stage).map((p) => p.field)).toEqual(["setpoint"]);
      expect(check(kind, unit, aboveHigh, stage).map((p) => p.field)).toEqual(["setpoint"]);
    },
  );

  it("a drying temperature of 1e9 °C is refused with a reason a person can act on", () => {
    expect(check("drying_temperature", "°C", 1e9, "drying")[0].message).toMatch(
      /above 200 °C, beyond what a parts washer can run/,
    );
    expect(check("drying_temperature", "°C", Infinity, "drying")[0].message).toMatch(
      /finite number/,
    );
  });

  it("checks the validated range's ends as well as the setpoint", () => {
    const problems = parameterProblems({
      kind: "time",
      unit: "s",
      setpoint: 300,
      validatedLow: -5,
      validatedHigh: 90_000,
      stageKind: "wash",
    });
    expect(problems.map((p) => p.field)).toEqual(["validatedLow", "validatedHigh"]);
  });
});

describe("a setpoint inside its own validated range", () => {
  it("passes inside or on the ends, and with an open end", () => {
    expect(
      ownRangeProblem({ setpoint: 55, validatedLow: 50, validatedHigh: 65, unit: "°C" }),
    ).toBeNull();
    expect(
      ownRangeProblem({ setpoint: 65, validatedLow: 50, validatedHigh: 65, unit: "°C" }),
    ).toBeNull();
    expect(
      ownRangeProblem({ setpoint: 160, validatedLow: null, validatedHigh: 200, unit: "h" }),
    ).toBeNull();
  });
  it("refuses a setpoint outside the range written beside it, naming both", () => {
    expect(
      ownRangeProblem({ setpoint: 70, validatedLow: 50, validatedHigh: 65, unit: "°C" }),
    ).toEqual({
      field: "setpoint",
      message: "The setpoint 70 °C lies outside its own validated range 50–65 °C.",
    });
    expect(
      ownRangeProblem({ setpoint: 5, validatedLow: 10, validatedHigh: null, unit: "mbar" })
        ?.message,
    ).toMatch(/10–∞ mbar/);
  });
});
