import type { LabMethodKind } from "@/db/enums";

/** Which kinds of lab method a run of each test type cites. */
export const METHOD_KINDS_BY_TEST: Partial<Record<string, readonly LabMethodKind[]>> = {
  particle_cleanliness: ["extraction", "analysis"],
  gravimetric: ["extraction", "gravimetric"],
};
