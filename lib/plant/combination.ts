/** What the server found about the recipe version and part family a run is to be opened on. */
export interface RunCombinationFacts {
  familyCode: string;
  recipeCode: string;
  version: number;
  /** The version is qualified for the family. */
  qualified: boolean;
  /** The version is the proposal of an open change request (the run tied to it or not yet linked), and the change
   * qualifies the family: the family is qualified on the version it replaces, or the change adds this family. */
  requalifiesIt: boolean;
  /** The run cites a validation protocol written for exactly this recipe version and part family. */
  protocolForIt: boolean;
}

/**
 * A run is evidence for one recipe version cleaning one part family, so it is opened only where
 * that pairing is validated, or where the evidence is being gathered to validate it. Otherwise the
 * part family's history would claim a recipe that was never proven for it [practice].
 */
export function runCombinationRefusal(f: RunCombinationFacts): string | null {
  if (f.qualified || f.requalifiesIt || f.protocolForIt) return null;
  return `${f.familyCode} is not qualified on ${f.recipeCode} v${f.version}: open the run on a qualified combination, under a validation protocol for ${f.familyCode} on ${f.recipeCode} v${f.version}, or on the change request that qualifies it.`;
}
