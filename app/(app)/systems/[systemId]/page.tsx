import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { RecipeTable } from "@/components/recipes/recipe-table";
import { SystemEditor } from "@/components/systems/system-editor";
import { PageHeader } from "@/components/ui/page-header";
import { humanize, STAGE_MODE_LABELS, SYSTEM_KIND_LABELS } from "@/lib/format/labels";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getCleaningSystem } from "@/lib/server/plant/queries";
import { RetireSystemForm } from "@/components/systems/retire-system-form";
import { effectiveRecipeNames } from "@/lib/server/systems/queries";
import { retireSystemAction, updateSystemAction } from "../actions";
import { formatDate } from "@/lib/format/date";
import { withUnit } from "@/lib/format/number";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ systemId: string }>;
}): Promise<Metadata> {
  return recordTitle("system", (await params).systemId, "Cleaning system");
}

export default async function SystemPage({ params }: { params: Promise<{ systemId: string }> }) {
  const user = await requirePageUser("systems.view");
  const { systemId } = await params;
  const system = /^[0-9a-f-]{36}$/.test(systemId) ? await getCleaningSystem(systemId) : undefined;
  if (!system) notFound();
  const manage = can(user.roles, "systems.manage");
  const runs = manage && system.active ? await effectiveRecipeNames(system.id) : [];
  return (
    <>
      <PageHeader
        title={`${system.code} · ${system.name}`}
        description={system.description ?? undefined}
      />
      <dl className="mb-6 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="font-medium text-stone-700">Status</dt>
        <dd>
          {system.active
            ? "In service"
            : `Retired ${formatDate(system.retiredAt)}: ${system.retireReason ?? ""}`}
        </dd>
        <dt className="font-medium text-stone-700">Asset number</dt>
        <dd>{system.assetNumber ?? "—"}</dd>
        <dt className="font-medium text-stone-700">Kind</dt>
        <dd>{SYSTEM_KIND_LABELS[system.kind] ?? humanize(system.kind)}</dd>
        <dt className="font-medium text-stone-700">Site</dt>
        <dd>{system.siteName}</dd>
      </dl>
      <section
        aria-labelledby="stages"
        className="mb-8 rounded-lg border border-stone-200 bg-white p-5"
      >
        <h2 id="stages" className="text-lg font-semibold">
          Stages
        </h2>
        <Table density="compact" caption={<>Stages of {system.name}</>} frameClassName="mt-2">
          <THead>
            <Th>#</Th>
            <Th>Stage</Th>
            <Th>Kind</Th>
            <Th>Can run</Th>
            <Th align="right">Tank volume</Th>
            <Th align="right">Filter rating</Th>
            <Th>Equipment</Th>
          </THead>
          <TBody>
            {system.stages.map((st) => (
              <tr key={st.id}>
                <Td className="tabular-nums">{st.position}</Td>
                <Td>{st.name}</Td>
                <Td>{humanize(st.kind)}</Td>
                <Td>{st.capabilities.map((c) => STAGE_MODE_LABELS[c] ?? c).join(", ")}</Td>
                <Td numeric>{st.tankVolumeL === null ? "—" : withUnit(st.tankVolumeL, "L")}</Td>
                <Td numeric>
                  {st.filterRatingUm === null ? "—" : withUnit(st.filterRatingUm, "µm")}
                </Td>
                <Td>{equipmentWords(st) || "—"}</Td>
              </tr>
            ))}
          </TBody>
        </Table>
        {manage && system.active && (
          <details className="mt-4">
            <summary className="cursor-pointer text-sm font-medium text-brand-800">
              Edit system and stages
            </summary>
            <div className="mt-3">
              <SystemEditor mode="edit" action={updateSystemAction} system={system} runs={runs} />
            </div>
          </details>
        )}
        {manage && system.active && (
          <details className="mt-4">
            <summary className="cursor-pointer text-sm font-medium text-brand-800">
              Retire system
            </summary>
            <div className="mt-3 max-w-xl">
              <RetireSystemForm
                action={retireSystemAction}
                systemId={system.id}
                code={system.code}
              />
            </div>
          </details>
        )}
      </section>
      {can(user.roles, "recipe.edit") && system.active && (
        <p className="mb-4">
          <IntentLink
            href={`/systems/${system.id}/recipes/new`}
            className="text-sm font-medium text-brand-800 hover:underline"
          >
            New recipe for {system.code}
          </IntentLink>
          {" · "}
          <IntentLink
            href={`/systems/${system.id}/recipes/import`}
            className="text-sm font-medium text-brand-800 hover:underline"
          >
            Import a recipe from CSV
          </IntentLink>
        </p>
      )}
      {system.recipes.map((recipe) => {
        const v = recipe.effectiveVersion;
        return (
          <section
            key={recipe.id}
            className="mb-8 rounded-lg border border-stone-200 bg-white p-5"
            aria-labelledby={`r-${recipe.id}`}
          >
            <h2 id={`r-${recipe.id}`} className="text-lg font-semibold">
              <IntentLink
                href={`/systems/recipes/${recipe.id}`}
                className="text-brand-800 hover:underline"
              >
                {recipe.code} · {recipe.name}
              </IntentLink>
            </h2>
            <p className="text-sm text-stone-600">
              {v
                ? `Effective version ${v.version} since ${formatDate(v.effectiveFrom)} · detergent: ${v.detergent ?? "none"}`
                : "No effective version"}
            </p>
            {v && (
              <RecipeTable
                content={v}
                caption={`Parameters of ${recipe.name}, version ${v.version}`}
              />
            )}
          </section>
        );
      })}
    </>
  );
}

/** The figures that define a stage's modes, in words with their units. */
function equipmentWords(st: {
  ultrasonicPowerW: number | null;
  ultrasonicFrequencyKHz: number | null;
  sprayPressureBar: number | null;
  injectionPressureBar: number | null;
  nozzleSet: string | null;
}) {
  const parts: string[] = [];
  if (st.ultrasonicPowerW !== null)
    parts.push(
      `ultrasonic ${withUnit(st.ultrasonicPowerW, "W")}${st.ultrasonicFrequencyKHz === null ? "" : ` at ${withUnit(st.ultrasonicFrequencyKHz, "kHz")}`}`,
    );
  if (st.sprayPressureBar !== null) parts.push(`spray ${withUnit(st.sprayPressureBar, "bar")}`);
  if (st.injectionPressureBar !== null)
    parts.push(`injection ${withUnit(st.injectionPressureBar, "bar")}`);
  if (st.nozzleSet) parts.push(`nozzles ${st.nozzleSet}`);
  return parts.join("; ");
}
