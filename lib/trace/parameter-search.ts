/** One traceable parameter of one recipe, as the trace search lists it. */
export interface TraceParameter {
  key: string;
  name: string;
  unit: string;
  stage: string;
  recipeId: string;
  recipeCode: string;
  recipeName: string;
  systemId: string;
  systemCode: string;
  systemName: string;
  versions: number;
}

export interface ParameterFilter {
  systemId?: string;
  recipeId?: string;
  /** Words that must all appear, literally, in the key, name, stage, unit, recipe or system code. */
  q?: string;
}

/** How many matches the search sends to the page; the count says how many more there are. */
export const MATCH_LIMIT = 40;

/** The parameters a filter matches, the first `limit` of them in list order, and how many in all. */
export function matchParameters(
  parameters: readonly TraceParameter[],
  filter: ParameterFilter,
  limit = MATCH_LIMIT,
) {
  const words = (filter.q ?? "").toLowerCase().split(/\s+/).filter(Boolean);
  const matches = parameters.filter((p) => {
    if (filter.systemId && p.systemId !== filter.systemId) return false;
    if (filter.recipeId && p.recipeId !== filter.recipeId) return false;
    const text =
      `${p.key} ${p.name} ${p.stage} ${p.unit} ${p.recipeCode} ${p.systemCode}`.toLowerCase();
    return words.every((w) => text.includes(w));
  });
  return { total: matches.length, items: matches.slice(0, limit) };
}

/** The cleaning systems and recipes that hold traceable parameters, for the two choosers. */
export function traceScopes(
  parameters: readonly Pick<
    TraceParameter,
    "systemId" | "systemCode" | "systemName" | "recipeId" | "recipeCode" | "recipeName"
  >[],
) {
  const systems = new Map<string, { id: string; label: string }>();
  const recipes = new Map<string, { id: string; label: string; systemId: string }>();
  for (const p of parameters) {
    systems.set(p.systemId, { id: p.systemId, label: `${p.systemCode} · ${p.systemName}` });
    recipes.set(p.recipeId, {
      id: p.recipeId,
      label: `${p.recipeCode} · ${p.recipeName}`,
      systemId: p.systemId,
    });
  }
  return { systems: [...systems.values()], recipes: [...recipes.values()] };
}
export type TraceScopes = ReturnType<typeof traceScopes>;
