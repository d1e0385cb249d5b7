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
  title: "hot baths and dryers",
  text: "Wash and rinse baths are usually heated and dryers run hot enough to scald. Let tanks and chambers cool or wear heat-resistant protection before reaching in or draining.",
};

/**
 * The usual cautions for the equipment an administrator sets on a washer: a bath that is heated
 * (any wash or rinse tank, and every dryer), detergent in a wash stage, ultrasonic noise, hot parts
 * from a vacuum dryer, and isolation for filter changes. No temperatures are known here, so the
 * burn caution goes by stage kind [practice]; the recipe screens refine it from their setpoints.
 */
export function hazardsOfEquipment(stages: EquipmentHazardStage[]): Hazard[] {
  const params: HazardInput[] = [];
  let heated = false;
  for (const s of stages) {
    if (s.kind === "wash") params.push({ kind: "concentration", setpoint: 0, unit: "" });
    if (
      s.kind === "drying" ||
      ((s.kind === "wash" || s.kind === "rinse" || s.kind === "final_rinse") &&
        s.tankVolumeL !== null)
    )
      heated = true;
    for (const mode of s.capabilities) params.push({ kind: "other", setpoint: 0, unit: "", mode });
    if (s.filterRatingUm !== null) params.push({ kind: "filter_interval", setpoint: 0, unit: "" });
  }
  const found = hazardsOfParameters(params);
  return heated ? [HOT_BATH, ...found] : found;
}
