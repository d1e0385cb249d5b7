"use client";

import Link from "next/link";
import { useId, useMemo, useState } from "react";

export interface PickerParameter {
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

const LIMIT = 40;

/** Narrow by cleaning system and recipe, then type any part of a parameter's name, key, stage or unit. */
export function ParameterPicker({ parameters, selected }: { parameters: PickerParameter[]; selected?: { recipeId: string; key: string } }) {
  const id = useId();
  const initialRecipe = selected ? parameters.find((p) => p.recipeId === selected.recipeId) : undefined;
  const [systemId, setSystemId] = useState(initialRecipe?.systemId ?? "");
  const [recipeId, setRecipeId] = useState(initialRecipe?.recipeId ?? "");
  const [query, setQuery] = useState("");

  const systems = useMemo(() => [...new Map(parameters.map((p) => [p.systemId, `${p.systemCode} · ${p.systemName}`])).entries()], [parameters]);
  const recipes = useMemo(
    () => [...new Map(parameters.filter((p) => !systemId || p.systemId === systemId).map((p) => [p.recipeId, `${p.recipeCode} · ${p.recipeName}`])).entries()],
    [parameters, systemId],
  );
  const matches = useMemo(() => {
    const words = query.toLowerCase().split(/\s+/).filter(Boolean);
    return parameters.filter((p) => {
      if (systemId && p.systemId !== systemId) return false;
      if (recipeId && p.recipeId !== recipeId) return false;
      const text = `${p.key} ${p.name} ${p.stage} ${p.unit} ${p.recipeCode} ${p.systemCode}`.toLowerCase();
      return words.every((w) => text.includes(w));
    });
  }, [parameters, systemId, recipeId, query]);

  const select = "block w-full rounded-md border border-stone-300 bg-white px-3 py-2 text-sm";
  return (
    <section aria-labelledby={`${id}-h`} className="mb-8 rounded-lg border border-stone-200 bg-white p-5">
      <h2 id={`${id}-h`} className="mb-3 text-base font-semibold">
        Choose a parameter
      </h2>
      <div className="grid gap-3 sm:grid-cols-3">
        <div className="space-y-1">
          <label htmlFor={`${id}-system`} className="block text-sm font-medium text-stone-800">
            Cleaning system
          </label>
          <select
            id={`${id}-system`}
            className={select}
            value={systemId}
            onChange={(e) => {
              setSystemId(e.target.value);
              setRecipeId("");
            }}
          >
            <option value="">All systems</option>
            {systems.map(([value, label]) => (
              <option key={value} value={value}>
                {label}
              </option>
            ))}
          </select>
        </div>
        <div className="space-y-1">
          <label htmlFor={`${id}-recipe`} className="block text-sm font-medium text-stone-800">
            Recipe
          </label>
          <select id={`${id}-recipe`} className={select} value={recipeId} onChange={(e) => setRecipeId(e.target.value)}>
            <option value="">All recipes</option>
            {recipes.map(([value, label]) => (
              <option key={value} value={value}>
                {label}
              </option>
            ))}
          </select>
        </div>
        <div className="space-y-1">
          <label htmlFor={`${id}-q`} className="block text-sm font-medium text-stone-800">
            Search parameters
          </label>
          <input
            id={`${id}-q`}
            type="search"
            value={query}
            onChange={(e) => setQuery(e.target.value)}
            placeholder="e.g. drying temperature"
            aria-controls={`${id}-results`}
            className="block w-full rounded-md border border-stone-300 bg-white px-3 py-2 text-sm"
          />
        </div>
      </div>
      <p className="mt-3 text-xs text-stone-600" aria-live="polite">
        {matches.length === 0 ? "No parameter matches." : `${matches.length} parameter${matches.length === 1 ? "" : "s"} match${matches.length === 1 ? "es" : ""}${matches.length > LIMIT ? `; the first ${LIMIT} are shown` : ""}.`}
      </p>
      <ul id={`${id}-results`} aria-label="Matching parameters" className="mt-2 max-h-72 divide-y divide-stone-100 overflow-y-auto rounded-md border border-stone-200">
        {matches.slice(0, LIMIT).map((p) => {
          const current = selected?.recipeId === p.recipeId && selected.key === p.key;
          return (
            <li key={`${p.recipeId} ${p.key}`}>
              <Link
                href={`/trace?recipe=${p.recipeId}&key=${encodeURIComponent(p.key)}`}
                aria-current={current ? "true" : undefined}
                className={`flex flex-wrap items-baseline justify-between gap-x-4 px-3 py-2 text-sm hover:bg-brand-50 ${current ? "bg-brand-50 font-semibold" : ""}`}
              >
                <span>
                  {p.name} <span className="font-mono text-xs text-stone-600">{p.key}</span>
                </span>
                <span className="text-xs text-stone-600">
                  {p.stage} · {p.recipeCode} · {p.systemCode} · {p.versions} version{p.versions === 1 ? "" : "s"}
                </span>
              </Link>
            </li>
          );
        })}
      </ul>
    </section>
  );
}
