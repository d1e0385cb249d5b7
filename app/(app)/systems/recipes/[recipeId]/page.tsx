import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { DeviationList } from "@/components/deviations/deviation-list";
import { IntervalForm } from "@/components/changes/interval-form";
import { InitialValidationForm } from "@/components/changes/initial-validation-form";
import { OpenChangeForm } from "@/components/changes/open-change-form";
import { RecipeTable } from "@/components/recipes/recipe-table";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { humanize } from "@/lib/format/labels";
import { OPEN_STATUSES, CHANGE_STATUS_LABELS } from "@/lib/changes/workflow";
import { requalificationDue } from "@/lib/changes/periodic";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { deviationsOfRecipe } from "@/lib/server/deviations/queries";
import { NcPanel } from "@/components/nonconformances/nc-panel";
import { getRecipePage } from "@/lib/server/changes/queries";
import { listPartFamilies } from "@/lib/server/plant/queries";
import {
  openChangeAction,
  openInitialValidationAction,
  setRequalificationIntervalAction,
} from "../../../changes/actions";
import { formatDate } from "@/lib/format/date";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ recipeId: string }>;
}): Promise<Metadata> {
  return recordTitle("recipe", (await params).recipeId, "Recipe");
}

export default async function RecipePage({ params }: { params: Promise<{ recipeId: string }> }) {
  const user = await requirePageUser("systems.view");
  const { recipeId } = await params;
  const page = /^[0-9a-f-]{36}$/.test(recipeId) ? await getRecipePage(recipeId) : undefined;
  if (!page) notFound();
  const { recipe, system, effective, content, versions, intervals, changes } = page;
  // Active ones first: the people at the washer need those; ended ones stay on record.
  const temporary = (await deviationsOfRecipe(recipe.id)).sort(
    (a, b) => Number(b.state === "active") - Number(a.state === "active"),
  );
  const open = changes.find((c) => OPEN_STATUSES.includes(c.status));
  const canSeeChanges = can(user.roles, "changes.view");
  // A new recipe's draft first version, waiting to be routed through its initial validation.
  const draft = !effective && !open ? versions.find((v) => v.status === "draft") : undefined;
  const families =
    draft && can(user.roles, "change.draft") ? (await listPartFamilies()).map((r) => r.family) : [];
  return (
    <>
      <PageHeader
        title={`${recipe.code} · ${recipe.name}`}
        description={
          <>
            On{" "}
            <IntentLink href={`/systems/${system.id}`} className="text-brand-800 hover:underline">
              {system.code} {system.name}
            </IntentLink>
            . {recipe.description}
          </>
        }
      />
      <div className="grid gap-8 xl:grid-cols-[1fr_24rem]">
        <section
          aria-labelledby="effective"
          className="rounded-lg border border-stone-200 bg-white p-5"
        >
          <h2 id="effective" className="text-lg font-semibold">
            {effective ? `Effective version ${effective.version}` : "No effective version"}
          </h2>
          {effective && (
            <p className="text-sm text-stone-600">
              Effective since {formatDate(effective.effectiveFrom)} · detergent:{" "}
              {effective.detergent ?? "none"} · {effective.notes} ·{" "}
              <a
                href={`/api/recipes/${recipe.id}/csv?version=${effective.version}`}
                className="text-brand-800 underline"
              >
                Export as CSV
              </a>
            </p>
          )}
          {content && effective && (
            <RecipeTable content={content} caption={`Parameters of version ${effective.version}`} />
          )}
        </section>
        <div className="space-y-6">
          {draft && can(user.roles, "change.draft") && (
            <section
              aria-labelledby="validate"
              className="rounded-lg border border-stone-200 bg-white p-5"
            >
              <h2 id="validate" className="mb-1 text-base font-semibold">
                Initial validation
              </h2>
              <p className="mb-3 text-sm text-stone-600">
                Version {draft.version} is a draft. It becomes effective only when its validation is
                approved, its evidence gate holds and a second person verifies it.
              </p>
              <InitialValidationForm
                action={openInitialValidationAction}
                recipeId={recipe.id}
                families={families}
              />
            </section>
          )}
          {effective && can(user.roles, "change.draft") && (
            <section
              aria-labelledby="change"
              className="rounded-lg border border-stone-200 bg-white p-5"
            >
              <h2 id="change" className="mb-3 text-base font-semibold">
                Change this recipe
              </h2>
              {open ? (
                <p className="text-sm">
                  <IntentLink
                    href={`/changes/${open.id}`}
                    className="font-medium text-brand-800 hover:underline"
                  >
                    {open.number}
                  </IntentLink>{" "}
                  is open ({CHANGE_STATUS_LABELS[open.status].toLowerCase()}): finish or withdraw it
                  before opening another.
                </p>
              ) : (
                <OpenChangeForm
                  action={openChangeAction}
                  recipeId={recipe.id}
                  version={effective.version}
                />
              )}
            </section>
          )}
          {temporary.length > 0 && (
            <section aria-labelledby="deviations">
              <h2 id="deviations" className="mb-2 text-base font-semibold">
                Temporary deviations
              </h2>
              <DeviationList label="Temporary deviations of this recipe" items={temporary} />
            </section>
          )}
          <section aria-labelledby="versions">
            <h2 id="versions" className="mb-2 text-base font-semibold">
              Versions
            </h2>
            <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm">
              {versions.map((v) => (
                <li key={v.id} className="flex justify-between px-3 py-2">
                  <IntentLink
                    href={`/systems/recipes/${recipe.id}/versions/${v.version}`}
                    className="text-brand-800 hover:underline"
                  >
                    Version {v.version}
                  </IntentLink>
                  <span>
                    {humanize(v.status)}
                    {v.effectiveFrom ? ` · from ${formatDate(v.effectiveFrom)}` : ""}
                    {v.effectiveTo ? ` to ${formatDate(v.effectiveTo)}` : ""}
                  </span>
                </li>
              ))}
            </ul>
          </section>
          <section aria-labelledby="families">
            <h2 id="families" className="mb-2 text-base font-semibold">
              Validated part families
            </h2>
            {intervals.length === 0 ? (
              <p className="text-sm text-stone-600">
                No part family is validated on the effective version.
              </p>
            ) : (
              <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm">
                {intervals.map(({ interval, family }) => (
                  <li key={interval.id} className="px-3 py-2">
                    <span className="font-medium">{family.code}</span> {family.name} · requalify
                    every {interval.intervalMonths} months · last{" "}
                    {formatDate(interval.lastQualifiedAt)} · next due{" "}
                    {formatDate(
                      requalificationDue(interval.lastQualifiedAt, interval.intervalMonths),
                    )}
                    {can(user.roles, "recipe.edit") && (
                      <IntervalForm
                        action={setRequalificationIntervalAction}
                        intervalId={interval.id}
                        months={interval.intervalMonths}
                        family={family.code}
                      />
                    )}
                  </li>
                ))}
              </ul>
            )}
          </section>
          {canSeeChanges && (
            <section aria-labelledby="history">
              <h2 id="history" className="mb-2 text-base font-semibold">
                Change requests
              </h2>
              {changes.length === 0 ? (
                <p className="text-sm text-stone-600">None yet.</p>
              ) : (
                <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm">
                  {changes.map((c) => (
                    <li key={c.id} className="px-3 py-2">
                      <IntentLink
                        href={`/changes/${c.id}`}
                        className="font-medium text-brand-800 hover:underline"
                      >
                        {c.number}
                      </IntentLink>{" "}
                      {c.title} · {CHANGE_STATUS_LABELS[c.status]}
                      {c.impact ? ` · ${c.impact}` : ""}
                    </li>
                  ))}
                </ul>
              )}
            </section>
          )}
        </div>
      </div>
      <NcPanel roles={user.roles} where={{ recipeId: recipe.id }} />
    </>
  );
}
