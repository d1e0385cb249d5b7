import type { Metadata } from "next";
import { DeviationList } from "@/components/deviations/deviation-list";
import { ParameterPicker } from "@/components/trace/parameter-picker";
import { ParameterTimeline } from "@/components/trace/parameter-timeline";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { rangeWithUnit } from "@/lib/format/number";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { traceTitle } from "@/lib/server/page-titles";
import { deviationsOfRecipe } from "@/lib/server/deviations/queries";
import {
  getParameterHistory,
  listTraceableParameters,
  listTraceScopes,
  searchTraceableParameters,
} from "@/lib/server/trace/parameter-history";
import { NcPanel } from "@/components/nonconformances/nc-panel";
import { TRACE_ENTRIES_PAGE, traceQuerySchema } from "@/lib/schemas/trace";
import { matchParameters } from "@/lib/trace/parameter-search";
import { IntentLink } from "@/components/ui/intent-link";

export async function generateMetadata({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}): Promise<Metadata> {
  const query = traceQuerySchema.safeParse(await searchParams);
  return query.success ? traceTitle(query.data.recipe, query.data.key) : { title: "Trace" };
}

export default async function TracePage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("trace.view");
  const query = traceQuerySchema.safeParse(await searchParams);
  const selected =
    query.success && query.data.recipe && query.data.key
      ? { recipeId: query.data.recipe, key: query.data.key }
      : undefined;
  const shown = (query.success && query.data.entries) || TRACE_ENTRIES_PAGE;
  // The choosers need names only; the list under them reads the chosen recipe's parameters alone.
  const [parameters, history] = await Promise.all([
    selected ? listTraceableParameters({ recipeId: selected.recipeId }) : [],
    selected ? getParameterHistory(selected, { newest: shown }) : undefined,
  ]);
  const temporary = history
    ? await deviationsOfRecipe(history.recipe.id, new Date(), history.parameter.key)
    : [];
  const older = history?.older?.count ?? 0;
  const total = (history?.entries.length ?? 0) + older;
  const current = history?.entries.findLast((e) => e.period.kind === "in_force")?.period.value;
  const initialRecipe = selected
    ? parameters.find((p) => p.recipeId === selected.recipeId)
    : undefined;
  // The chooser's filter from the address (kept there as the user narrows it), else the chosen
  // parameter's own system and recipe.
  const asked = query.success ? query.data : {};
  const systemId = asked.system ?? initialRecipe?.systemId ?? "";
  const scopes = await listTraceScopes(systemId || undefined);
  const knownSystem = scopes.systems.some((s) => s.id === systemId);
  const recipeId = !knownSystem
    ? ""
    : asked.system
      ? (scopes.recipes.find((r) => r.id === asked.inRecipe)?.id ?? "")
      : (initialRecipe?.recipeId ?? "");
  const initialFilter = {
    systemId: knownSystem ? systemId : "",
    recipeId,
    q: asked.q ?? "",
  };
  const initial =
    selected && recipeId === selected.recipeId
      ? matchParameters(parameters, initialFilter)
      : await searchTraceableParameters(initialFilter);

  return (
    <>
      <PageHeader
        title="Trace"
        description="Every value a recipe parameter has had, who changed it, why, who approved it and which evidence requalified it."
      />
      <ParameterPicker
        scopes={scopes}
        initial={initial}
        initialFilter={initialFilter}
        selected={selected}
      />
      {!selected ? (
        <EmptyState title="No parameter chosen">
          Choose a cleaning system and recipe, or type part of a parameter&apos;s name, then pick it
          from the list to see its whole history.
        </EmptyState>
      ) : !history ? (
        <EmptyState title="Parameter not found">
          No recipe holds a parameter with that key. Pick one from the list above.
        </EmptyState>
      ) : (
        <section aria-labelledby="history">
          <h2 id="history" className="text-lg font-semibold">
            {history.parameter.name}{" "}
            <span className="font-mono text-sm font-normal text-stone-600">
              {history.parameter.key}
            </span>
          </h2>
          <p className="mb-4 text-sm text-stone-700">
            {history.parameter.stage} stage of {history.recipe.code} ({history.recipe.name}) on{" "}
            {history.system.code} {history.system.name}
            {history.parameter.critical ? " · critical parameter" : ""}
            {current
              ? ` · now ${current.setpoint} ${current.unit}, validated ${rangeWithUnit(current.validatedLow, current.validatedHigh, current.unit)}`
              : ""}{" "}
            · {total} {total === 1 ? "entry" : "entries"}, newest first.
          </p>
          {temporary.length > 0 && (
            <section aria-labelledby="deviations" className="mb-6">
              <h3 id="deviations" className="mb-2 text-base font-semibold">
                Temporary deviations from the validated range
              </h3>
              <DeviationList label="Temporary deviations of this parameter" items={temporary} />
            </section>
          )}
          <ParameterTimeline history={history} canExport={can(user.roles, "trace.export")} />
          {older > 0 && (
            <p className="mt-4 text-sm">
              {history.entries.length} of {total} entries shown.{" "}
              <IntentLink
                href={`/trace?recipe=${history.recipe.id}&key=${encodeURIComponent(history.parameter.key)}&entries=${shown + TRACE_ENTRIES_PAGE}`}
                className="font-semibold text-brand-800 hover:underline"
              >
                {`Show ${Math.min(older, TRACE_ENTRIES_PAGE)} older ${Math.min(older, TRACE_ENTRIES_PAGE) === 1 ? "entry" : "entries"}`}
              </IntentLink>
            </p>
          )}
          <NcPanel roles={user.roles} where={{ recipeId: history.recipe.id }} />
        </section>
      )}
    </>
  );
}
