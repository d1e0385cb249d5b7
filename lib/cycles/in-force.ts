/** The dates a recipe version was in force; both ISO-8601 UTC, `effectiveTo` null while it still is. */
export interface VersionSpan {
  version: number;
  status: string;
  effectiveFrom: string | null;
  effectiveTo: string | null;
}

/**
 * Whether a cycle started at `at` ran under this version: from its effective time (inclusive) to the
 * time a later version superseded it (exclusive), so a cycle started at the moment of a change runs
 * under the new version. Drafts and proposals were never in force.
 */
export function inForceAt(v: VersionSpan, at: string): boolean {
  if (v.status !== "effective" && v.status !== "superseded") return false;
  if (!v.effectiveFrom) return false;
  const t = Date.parse(at);
  if (t < Date.parse(v.effectiveFrom)) return false;
  return v.effectiveTo === null || t < Date.parse(v.effectiveTo);
}
