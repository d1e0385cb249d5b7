/**
 * The usual cautions for a recipe's parameters. Thresholds are common practice
 * (water and steam above about 50 °C scald; a hot-air or vacuum dryer's air, walls and parts
 * give a dry-heat contact burn, not a scald); the site's own safety data sheets, local codes
 * and licensed practice govern.
 */
export interface HazardInput {
  kind: string;
  setpoint: number;
  unit: string;
  mode?: string | null;
  /** The top of the validated range: the bath may run there too. */
  validatedHigh?: number | null;
}

export interface Hazard {
  kind: "burn" | "dry_heat" | "pressure" | "chemical" | "hot_parts" | "noise" | "isolation";
  title: string;
  text: string;
}

const BURN_THRESHOLD_C = 50; // common practice

export function hazardsOfParameters(params: HazardInput[]): Hazard[] {
  const found = new Map<Hazard["kind"], Hazard>();
  let hottestBath = -Infinity;
  let hottestDryer = -Infinity;
  let highestPressure = -Infinity;
  let pressureUnit = "bar";
  for (const p of params) {
    const hottest = Math.max(p.setpoint, p.validatedHigh ?? -Infinity);
    if (p.kind === "temperature" && p.unit === "°C" && hottest > BURN_THRESHOLD_C) {
      hottestBath = Math.max(hottestBath, hottest);
      found.set("burn", {
        kind: "burn",
        title: "hot bath, steam and hot surfaces",
        text: `Baths here run up to ${hottestBath} °C: the water and its steam scald. Let tanks cool or wear heat-resistant protection before reaching in or draining.`,
      });
    }
    if (p.kind === "drying_temperature" && p.unit === "°C" && hottest > BURN_THRESHOLD_C) {
      hottestDryer = Math.max(hottestDryer, hottest);
      found.set("dry_heat", {
        kind: "dry_heat",
        title: "hot dryer and hot parts",
        text: `The dryer runs up to ${hottestDryer} °C: its air, chamber walls, baskets and the parts leaving it give a dry-heat contact burn. Let them cool or handle them with heat-resistant gloves.`,
      });
    }
    if (p.kind === "spray_pressure" || p.mode === "spray" || p.mode === "injection") {
      if (p.kind === "spray_pressure" && hottest > highestPressure) {
        highestPressure = hottest;
        pressureUnit = p.unit || pressureUnit;
      }
      found.set("pressure", {
        kind: "pressure",
        title: "spray and injection pressure",
        text: `${highestPressure > 0 ? `Jets here run up to ${highestPressure} ${pressureUnit}. ` : ""}A spray or injection jet can cut skin and force hot fluid into it. Keep the chamber closed while the pumps run, never hold a hand or a part into a jet, and isolate the pumps before opening.`,
      });
    }
    if (p.kind === "concentration") {
      found.set("chemical", {
        kind: "chemical",
        title: "detergent handling",
        text: "Alkaline and acidic detergents burn skin and eyes. Follow the detergent's safety data sheet for protective equipment, dosing and spills.",
      });
    }
    if (p.kind === "vacuum_pressure" || p.mode === "vacuum_drying") {
      found.set("hot_parts", {
        kind: "hot_parts",
        title: "vacuum dryer and hot parts",
        text: "Parts leave the vacuum dryer hot. Vent the chamber fully before opening and handle baskets with gloves.",
      });
    }
    if (
      p.kind === "ultrasonic_power" ||
      p.kind === "ultrasonic_frequency" ||
      p.mode === "ultrasonic"
    ) {
      found.set("noise", {
        kind: "noise",
        title: "ultrasonic noise",
        text: "Ultrasonic tanks are loud with the lid open. Keep the lid closed while running and wear hearing protection where signed.",
      });
    }
    if (p.kind === "filter_interval") {
      found.set("isolation", {
        kind: "isolation",
        title: "filter changes",
        text: "Isolate and lock out the machine, let it cool and relieve pressure before changing a filter.",
      });
    }
  }
  return [...found.values()];
}

/** The cautions of a whole recipe version: every parameter, with its stage's mode. */
export function hazardsOfStages(
  stages: { mode: string | null; parameters: Omit<HazardInput, "mode">[] }[],
): Hazard[] {
  const params: HazardInput[] = stages.flatMap((s) =>
    s.parameters.map((p) => ({ ...p, mode: s.mode })),
  );
  // A mode carries its own hazard even on a stage without parameters yet.
  for (const s of stages)
    if (s.parameters.length === 0 && s.mode)
      params.push({ kind: "other", setpoint: 0, unit: "", mode: s.mode });
  return hazardsOfParameters(params);
}
