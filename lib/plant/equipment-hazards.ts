import { hazardsOfParameters, type Hazard, type HazardInput } from "@/lib/recipes/hazards";

/** What the cautions need to know of a washer's stage. */
export interface EquipmentHazardStage {
  kind: string;
  capabilities: string[];
  tankVolumeL: number | null;
  filterRatingUm: number | null;
}

const HOT_BATH: Hazard = {
  kind: "burn",
  title: "hot baths",
  text: "Wash and rinse baths are usually heated: the water and its steam scald. Let tanks cool or wear heat-resistant protection before reaching in or draining.",
};

const HOT_DRYER: Hazard = {
  kind: "dry_heat",
  title: "hot dryer and hot parts",
  text: "Dryers run hot (hot air up to about 130 °C): the air, chamber walls, baskets and the parts leaving them give a dry-heat contact burn, not a scald. Let them cool or handle them with heat-resistant gloves.",
};

/**
 * The usual cautions for the equipment an administrator sets on a washer: a bath that is heated
 * (any wash or rinse tank: a scald), every dryer (a dry-heat burn), spray and injection pressure, detergent in a wash stage, ultrasonic noise, hot parts
 * from a vacuum dryer, and isolation for filter changes. No temperatures are known here, so the
 * burn caution goes by stage kind [practice]; the recipe screens refine it from their setpoints.
 */
export function hazardsOfEquipment(stages: EquipmentHazardStage[]): Hazard[] {
  const params: HazardInput[] = [];
  let heated = false;
  let dryer = false;
  for (const s of stages) {
    if (s.kind === "wash") params.push({ kind: "concentration", setpoint: 0, unit: "" });
    if (s.kind === "drying") dryer = true;
    if (
      (s.kind === "wash" || s.kind === "rinse" || s.kind === "final_rinse") &&
      s.tankVolumeL !== null
    )
      heated = true;
    for (const mode of s.capabilities) params.push({ kind: "other", setpoint: 0, unit: "", mode });
    if (s.filterRatingUm !== null) params.push({ kind: "filter_interval", setpoint: 0, unit: "" });
  }
  const found = hazardsOfParameters(params);
  return [...(heated ? [HOT_BATH] : []), ...(dryer ? [HOT_DRYER] : []), ...found];
}
