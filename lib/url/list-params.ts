/**
 * A list's filters, sort and page as URL search parameters, so a filtered list can be linked,
 * reloaded and shared. Every value is a string; a value equal to its default is left out, so the
 * unfiltered list keeps a clean address, and an unknown parameter is ignored.
 */
export type ListState = Record<string, string>;

interface ParamsLike {
  get(name: string): string | null;
}

/** The state the address describes: each known key from the URL, else its default. */
export function readListParams<T extends ListState>(
  search: ParamsLike | null | undefined,
  defaults: T,
): T {
  const out: ListState = { ...defaults };
  for (const key of Object.keys(defaults)) {
    const value = search?.get(key);
    // A parameter too long to be a real filter value is a crafted link: the default stands.
    if (value !== null && value !== undefined && value.length <= 200) out[key] = value;
  }
  return out as T;
}

/** The search string for a state ("" when everything is at its default), keys in the defaults' order. */
export function listSearch<T extends ListState>(state: T, defaults: T): string {
  const params = new URLSearchParams();
  for (const key of Object.keys(defaults)) {
    const value = state[key] ?? defaults[key];
    if (value !== defaults[key]) params.set(key, value);
  }
  const qs = params.toString();
  return qs ? `?${qs}` : "";
}

/** A server page's `searchParams` (each value a string or a list) read like the URL. */
export function fromPageParams(params: Record<string, string | string[] | undefined>): ParamsLike {
  return {
    get: (name) =>
      typeof params[name] === "string"
        ? (params[name] as string)
        : Array.isArray(params[name])
          ? ((params[name] as string[])[0] ?? null)
          : null,
  };
}

/**
 * Whether a row passes a server list's filters: each non-empty `equals` filter must match its
 * value exactly, and the words of `q` must each appear (any case) in one of the `text` fields.
 */
export function rowMatches(filters: {
  equals?: Record<string, { want: string; have: string | null | undefined }>;
  q?: string;
  text?: (string | null | undefined)[];
}): boolean {
  for (const { want, have } of Object.values(filters.equals ?? {}))
    if (want !== "" && want !== have) return false;
  const words = (filters.q ?? "").toLowerCase().split(/\s+/).filter(Boolean);
  const haystack = (filters.text ?? []).filter(Boolean).join(" ").toLowerCase();
  return words.every((w) => haystack.includes(w));
}
