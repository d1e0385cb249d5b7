import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { ControlPlanLinks } from "@/components/control-plans/control-plan-links";
import { RecipeTable } from "@/components/recipes/recipe-table";
import { PageHeader } from "@/components/ui/page-header";
import { can } from "@/lib/auth/permissions";
import { CHANGE_STATUS_LABELS } from "@/lib/changes/workflow";
import { formatDate } from "@/lib/format/date";
import { humanize } from "@/lib/format/labels";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getRecipeVersionPage } from "@/lib/server/changes/queries";
import { controlPlansOf } from "@/lib/server/control-plans/queries";

export const metadata: Metadata = { title: "Recipe version" };

/** Any version of a recipe, read-only: a proposal is edited only on its change request, an earlier version never. */
export default async function RecipeVersionPage({
  params,
}: {
  params: Promise<{ recipeId: string; version: string }>;
}) {
  const user = await requirePageUser("systems.view");
  const { recipeId, version } = await params;
  const number = /^[1-9][0-9]{0,5}$/.test(version) ? Number(version) : NaN;
  const page =
    /^[0-9a-f-]{36}$/.test(recipeId) && Number.isInteger(number)
      ? await getRecipeVersionPage(recipeId, number)
      : undefined;
  if (!page) notFound();
  const { recipe, system, version: v, content, proposedBy } = page;
  const canSeeChanges = can(user.roles, "changes.view");
  const plans = await controlPlansOf({ recipeVersionId: v.id });
  return (
    <>
      <PageHeader
        title={`${recipe.code} · version ${v.version}`}
        description={
          <>
            <IntentLink
              href={`/systems/recipes/${recipe.id}`}
              className="text-brand-800 hover:underline"
            >
              {recipe.name}
            </IntentLink>{" "}
            on {system.code}. {humanize(v.status)}
            {v.effectiveFrom ? `, effective from ${formatDate(v.effectiveFrom)}` : ""}
            {v.effectiveTo ? ` to ${formatDate(v.effectiveTo)}` : ""}. Read-only.
          </>
        }
      />
      <section
        aria-labelledby="content"
        className="rounded-lg border border-stone-200 bg-white p-5"
      >
        <h2 id="content" className="text-lg font-semibold">
          Stages and parameters
        </h2>
        <p className="text-sm text-stone-600">
          Detergent: {v.detergent ?? "none"}
          {v.notes ? ` · ${v.notes}` : ""} ·{" "}
          <a
            href={`/api/recipes/${recipe.id}/csv?version=${v.version}`}
            className="text-brand-800 underline"
          >
            Export as CSV
          </a>
        </p>
        <RecipeTable content={content} caption={`Parameters of version ${v.version}`} />
      </section>
      <ControlPlanLinks
        plans={plans}
        none="No control plan on this version yet: each qualified part family gets one."
      />
      {canSeeChanges && proposedBy.length > 0 && (
        <p className="mt-4 text-sm">
          Proposed by{" "}
          {proposedBy.map((c, i) => (
            <span key={c.id}>
              {i > 0 ? ", " : ""}
              <IntentLink
                href={`/changes/${c.id}`}
                className="font-medium text-brand-800 hover:underline"
              >
                {c.number}
              </IntentLink>{" "}
              ({CHANGE_STATUS_LABELS[c.status].toLowerCase()})
            </span>
          ))}
          .
        </p>
      )}
    </>
  );
}
