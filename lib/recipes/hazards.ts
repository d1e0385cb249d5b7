/**
 * The usual cautions for a recipe's parameters. Thresholds are common practice
 * (surfaces and water above about 50 °C scald); the site's own safety data sheets,
 * local codes and licensed practice govern.
 */
export interface HazardInput {
  kind: string;
  setpoint: number;
  unit: string;
  mode?: string | null;
}

export interface Hazard {
  kind: "burn" | "chemical" | "hot_parts" | "noise" | "isolation";
  title: string;
  text: string;
}

const BURN_THRESHOLD_C = 50; // common practice

export function hazardsOfParameters(params: HazardInput[]): Hazard[] {
  const found = new Map<Hazard["kind"], Hazard>();
  for (const p of params) {
    if ((p.kind === "temperature" || p.kind === "drying_temperature") && p.unit === "°C" && p.setpoint > BURN_THRESHOLD_C) {
      found.set("burn", {
        kind: "burn",
        title: "hot bath, steam and hot surfaces",
        text: `A setpoint of ${p.setpoint} °C scalds. Let tanks and chambers cool or wear heat-resistant protection before reaching in.`,
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
    if (p.kind === "ultrasonic_power" || p.kind === "ultrasonic_frequency" || p.mode === "ultrasonic") {
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
