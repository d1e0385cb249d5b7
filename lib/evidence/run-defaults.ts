import { TEST_TYPES } from "@/db/enums";
import { TEST_TYPE_LABELS, type TestType } from "@/lib/recipes/test-types";

export interface RunDefaults {
  changeRequestId?: string;
  recipeVersionId?: string;
  partFamilyId?: string;
  testType?: TestType;
  requirement?: string;
}

interface ChangeOption {
  id: string;
  number: string;
  toVersionId: string | null;
  partFamilyId: string | null;
}

interface CombinationOptions {
  versions: readonly { id: string }[];
  families: readonly { id: string }[];
}

/**
 * What the new-run form starts with when it is opened from a change request's
 * requalification gate (`?change=…&testType=…&samples=…`): the change, the version it
 * proposes, the family it adds and the required test. Anything the address names that
 * is not on offer is ignored; the server checks the submitted form as always.
 */
export function runDefaultsFromQuery(
  query: Record<string, string | string[] | undefined>,
  changes: ChangeOption[],
  combination: CombinationOptions = { versions: [], families: [] },
): RunDefaults {
  const one = (key: string) => {
    const v = query[key];
    return typeof v === "string" ? v : undefined;
  };
  const change = changes.find((c) => c.id === one("change"));
  const type = one("testType");
  const testType = (TEST_TYPES as readonly string[]).includes(type ?? "")
    ? (type as TestType)
    : undefined;
  const samples = Number(one("samples"));
  if (!change) {
    // A control plan's due test (`?recipeVersion=…&partFamily=…&testType=…`) names its combination; it answers no change request.
    const recipeVersionId = combination.versions.find((v) => v.id === one("recipeVersion"))?.id;
    const partFamilyId = combination.families.find((f) => f.id === one("partFamily"))?.id;
    const defaults: RunDefaults = {};
    if (testType) defaults.testType = testType;
    if (recipeVersionId) defaults.recipeVersionId = recipeVersionId;
    if (partFamilyId) defaults.partFamilyId = partFamilyId;
    return defaults;
  }
  return {
    changeRequestId: change.id,
    recipeVersionId: change.toVersionId ?? undefined,
    partFamilyId: change.partFamilyId ?? undefined,
    testType,
    requirement:
      testType && Number.isInteger(samples) && samples > 0
        ? `${TEST_TYPE_LABELS[testType]} on ${samples} parts`
        : undefined,
  };
}
