"use client";

import { keepPreviousData, useQuery } from "@tanstack/react-query";
import { IntentLink } from "@/components/ui/intent-link";
import { useEffect, useId, useState } from "react";
import { RequestRefused } from "@/lib/http/refused";
import { Field, SelectField } from "@/components/ui/field";
import {
  MATCH_LIMIT,
  type ParameterFilter,
  type TraceParameter,
  type TraceScopes,
} from "@/lib/trace/parameter-search";

interface Matches {
  total: number;
  items: TraceParameter[];
}

interface ParameterPickerProps {
  /** Every system, and the recipes of the first filter's system (none before one is chosen). */
  scopes: TraceScopes;
  /** The matches for the first filter, rendered on the server so the list shows before any search. */
  initial: Matches;
  /** The filter the page opened with: from its address, else the chosen parameter's recipe. */
  initialFilter: { systemId: string; recipeId: string; q: string };
  selected?: { recipeId: string; key: string };
}

const CHOOSER_PARAMS = ["system", "inRecipe", "q"] as const;

/** The chooser's filter as the page's query string reads it back; empty parts are left out. */
function chooserParams(filter: { systemId: string; recipeId: string; q: string }): string {
  const params = new URLSearchParams();
  if (filter.systemId) params.set("system", filter.systemId);
  if (filter.systemId && filter.recipeId) params.set("inRecipe", filter.recipeId);
  if (filter.q) params.set("q", filter.q);
  return params.toString();
}

/** How long typing pauses before the search is sent: each keystroke would otherwise be a request. */
const SEARCH_PAUSE_MS = 250;

/** `value` once it has stayed the same for `ms`. */
function useDebounced<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return settled;
}

async function fetchMatches(filter: ParameterFilter, signal?: AbortSignal): Promise<Matches> {
  const qs = new URLSearchParams({
    system: filter.systemId ?? "",
    recipe: filter.recipeId ?? "",
    q: filter.q ?? "",
  });
  const response = await fetch(`/api/trace/parameters?${qs}`, { cache: "no-store", signal });
  if (!response.ok) {
    const message =
      ((await response.json().catch(() => null)) as { error?: string } | null)?.error ??
      "The search failed; try again.";
    throw response.status < 500 ? new RequestRefused(message) : new Error(message);
  }
  return response.json();
}

async function fetchRecipes(systemId: string): Promise<TraceScopes["recipes"]> {
  const response = await fetch(`/api/trace/recipes?system=${encodeURIComponent(systemId)}`, {
    cache: "no-store",
  });
  if (!response.ok) throw new Error("The recipes of this system could not be read; try again.");
  return ((await response.json()) as { recipes: TraceScopes["recipes"] }).recipes;
}

/**
 * Narrow by cleaning system and recipe, then type any part of a parameter's name,
 * key, stage or unit. The server searches, so a plant's thousands of parameters
 * never travel to the browser.
 */
export function ParameterPicker({
  scopes,
  initial,
  initialFilter,
  selected,
}: ParameterPickerProps) {
  const id = useId();
  const [systemId, setSystemId] = useState(initialFilter.systemId);
  const [recipeId, setRecipeId] = useState(initialFilter.recipeId);
  const [query, setQuery] = useState(initialFilter.q);
  const q = useDebounced(query, SEARCH_PAUSE_MS);
  const isInitial =
    systemId === initialFilter.systemId &&
    recipeId === initialFilter.recipeId &&
    q.trim() === initialFilter.q.trim();
  // The filter lives in the address too, so a reload, Back or a shared link opens it again. It is
  // replaced, not pushed: each keystroke is not a step of the browser's history.
  const filterParams = chooserParams({ systemId, recipeId, q: q.trim() });
  useEffect(() => {
    const url = new URL(window.location.href);
    for (const name of CHOOSER_PARAMS) url.searchParams.delete(name);
    for (const [name, value] of new URLSearchParams(filterParams))
      url.searchParams.set(name, value);
    if (url.href !== window.location.href) window.history.replaceState(null, "", url);
  }, [filterParams]);
  const { data, error, isPlaceholderData } = useQuery({
    queryKey: ["trace-parameters", systemId, recipeId, q.trim()],
    // A newer search cancels the request of an older one (react-query aborts `signal`).
    queryFn: ({ signal }) => fetchMatches({ systemId, recipeId, q }, signal),
    initialData: isInitial ? initial : undefined,
    placeholderData: keepPreviousData,
  });
  const matches = data ?? initial;
  // A plant has hundreds of recipes: the chosen system's are asked for as it is chosen.
  const systemRecipes = useQuery({
    queryKey: ["trace-recipes", systemId],
    queryFn: () => fetchRecipes(systemId),
    enabled: systemId !== "",
    initialData: systemId === initialFilter.systemId ? scopes.recipes : undefined,
  });
  const recipes = systemId === "" ? [] : (systemRecipes.data ?? []);

  return (
    <section
      aria-labelledby={`${id}-h`}
      className="mb-8 rounded-lg border border-stone-200 bg-white p-5"
    >
      <h2 id={`${id}-h`} className="mb-3 text-base font-semibold">
        Choose a parameter
      </h2>
      <div className="grid gap-3 sm:grid-cols-3">
        <SelectField
          label="Cleaning system"
          value={systemId}
          onValueChange={(v) => {
            setSystemId(v);
            setRecipeId("");
          }}
          placeholder="All systems"
          options={scopes.systems.map((system) => ({ value: system.id, label: system.label }))}
        />
        <SelectField
          label="Recipe"
          value={recipeId}
          onValueChange={setRecipeId}
          placeholder={
            systemId === ""
              ? "Choose a system first"
              : systemRecipes.isPending
                ? "Reading the recipes…"
                : "All recipes"
          }
          disabled={systemId === ""}
          options={recipes.map((recipe) => ({ value: recipe.id, label: recipe.label }))}
        />
        <Field
          label="Search parameters"
          type="search"
          value={query}
          onValueChange={setQuery}
          placeholder="e.g. drying temperature"
          aria-controls={`${id}-results`}
        />
      </div>
      <p className="mt-3 text-xs text-stone-600" aria-live="polite">
        {error || systemRecipes.error
          ? (error ?? systemRecipes.error)!.message
          : isPlaceholderData || query !== q
            ? "Searching…"
            : matches.total === 0
              ? "No parameter matches."
              : `${matches.total.toLocaleString("en-GB")} parameter${matches.total === 1 ? "" : "s"} match${matches.total === 1 ? "es" : ""}${matches.total > MATCH_LIMIT ? `; the first ${MATCH_LIMIT} are shown` : ""}.`}
      </p>
      <ul
        id={`${id}-results`}
        aria-label="Matching parameters"
        aria-busy={isPlaceholderData || query !== q || undefined}
        className="mt-2 max-h-72 divide-y divide-stone-100 overflow-y-auto rounded-md border border-stone-200"
      >
        {matches.items.map((p) => {
          const current = selected?.recipeId === p.recipeId && selected.key === p.key;
          return (
            <li key={`${p.recipeId} ${p.key}`}>
              <IntentLink
                href={`/trace?${new URLSearchParams({ recipe: p.recipeId, key: p.key })}${filterParams ? `&${filterParams}` : ""}`}
                aria-current={current ? "true" : undefined}
                className={`flex flex-wrap items-baseline justify-between gap-x-4 px-3 py-2 text-sm hover:bg-brand-50 ${current ? "bg-brand-50 font-semibold" : ""}`}
              >
                <span>
                  {p.name} <span className="font-mono text-xs text-stone-600">{p.key}</span>
                </span>
                <span className="text-xs text-stone-600">
                  {p.stage} · {p.recipeCode} · {p.systemCode} · {p.versions} version
                  {p.versions === 1 ? "" : "s"}
                </span>
              </IntentLink>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
