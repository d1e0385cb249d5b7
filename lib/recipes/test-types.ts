import { PARAMETER_KINDS, STAGE_KINDS, type TEST_TYPES } from "@/db/enums";

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

/**
 * What a requalification matrix row is keyed by: a parameter kind, a stage
 * (or its mode) of a kind added or removed, a new detergent, or a new part
 * family on the recipe.
 */
export const MATRIX_SUBJECTS = [
  ...PARAMETER_KINDS.map((k) => `parameter:${k}` as const),
  // The same kind means a different risk in another stage: drying time calls for a dryness test, wash time does not.
  ...STAGE_KINDS.flatMap((stage) => PARAMETER_KINDS.map((k) => `parameter:${stage}:${k}` as const)),
  ...STAGE_KINDS.map((k) => `stage:${k}` as const),
  "detergent",
  "part_family",
] as const;
export type MatrixSubject = (typeof MATRIX_SUBJECTS)[number];

export function subjectLabel(subject: MatrixSubject): string {
  if (subject === "detergent") return "New detergent";
  if (subject === "part_family") return "New part family on the recipe";
  const [group, first, second] = subject.split(":");
  if (group === "stage") return `Stage or mode added or removed: ${first.replace(/_/g, " ")}`;
  return second
    ? `Parameter in a ${first.replace(/_/g, " ")} stage: ${second.replace(/_/g, " ")}`
    : `Parameter: ${first.replace(/_/g, " ")}`;
}
