import { evidenceListQuerySchema } from "@/lib/schemas/evidence-list";

/** The evidence list's state as its address holds it: every value a string, "" for none. */
export type EvidenceListAddress = {
  partFamilyId: string;
  recipeId: string;
  version: string;
  testType: string;
  outcome: string;
  from: string;
  to: string;
  sort: string;
  dir: string;
  page: string;
};

/**
 * What the list shows with nothing in its address: newest first, page 1, no filter. Filters, sort
 * and page live in the address (lib/url/list-params.ts), so a filtered list can be linked and
 * reloaded.
 */
export const EVIDENCE_LIST_DEFAULTS: EvidenceListAddress = {
  partFamilyId: "",
  recipeId: "",
  version: "",
  testType: "",
  outcome: "",
  from: "",
  to: "",
  sort: "performedOn",
  dir: "desc",
  page: "1",
};

const CHECKED = ["testType", "outcome", "from", "to", "sort", "dir", "page"] as const;

/**
 * The address with what the list cannot use set back to its default: a value the server would
 * refuse (a sort of "date", a page of -1), or a part family or recipe that is not in the lists.
 * An old or hand-edited link then opens the list, not an error. The version number is left as
 * typed: the form says what is wrong with it beside its field.
 */
export function usableListAddress<T extends EvidenceListAddress>(
  address: T,
  defaults: T,
  known: { familyIds: ReadonlySet<string>; recipeIds: ReadonlySet<string> },
): T {
  const usable = { ...address };
  for (const key of CHECKED) {
    const value = address[key];
    if (value !== "" && !evidenceListQuerySchema.shape[key].safeParse(value).success)
      usable[key] = defaults[key];
  }
  if (address.partFamilyId !== "" && !known.familyIds.has(address.partFamilyId))
    usable.partFamilyId = defaults.partFamilyId;
  if (address.recipeId !== "" && !known.recipeIds.has(address.recipeId)) {
    usable.recipeId = defaults.recipeId;
    usable.version = defaults.version;
  }
  return usable;
}
