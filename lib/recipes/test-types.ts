import type { TEST_TYPES } from "@/db/enums";

export type TestType = (typeof TEST_TYPES)[number];

export const TEST_TYPE_LABELS: Record<TestType, string> = {
  particle_cleanliness: "Particle cleanliness",
  gravimetric: "Gravimetric residue",
  wetting_tension: "Wetting tension",
  rinse_conductivity: "Rinse-water conductivity",
  visual: "Visual (stains)",
  uv_inspection: "UV inspection (oil films)",
  dryness: "Dryness",
};
