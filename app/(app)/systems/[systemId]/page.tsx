import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { RecipeTable } from "@/components/recipes/recipe-table";
import { SystemEditor } from "@/components/systems/system-editor";
import { PageHeader } from "@/components/ui/page-header";
import { humanize, STAGE_MODE_LABELS } from "@/lib/format/labels";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getCleaningSystem } from "@/lib/server/plant/queries";
import { updateSystemAction } from "../actions";
import { formatDate } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

export const metadata: Metadata = { title: "Cleaning system" };

export default async function SystemPage({ params }: { params: Promise<{ systemId: string }> }) {
  const user = await requirePageUser("systems.view");
  const { systemId } = await params;
  const system = /^[0-9a-f-]{36}$/.test(systemId) ? await getCleaningSystem(systemId) : undefined;
  if (!system) notFound();
  return (
    <>
      <PageHeader title={`${system.code} · ${system.name}`} description={system.description ?? undefined} />
      <section aria-labelledby="stages" className="mb-8 rounded-lg border border-stone-200 bg-white p-5">
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
          </THead>
          <TBody>
            {system.stages.map((st) => (
              <tr key={st.id}>
                <Td className="tabular-nums">{st.position}</Td>
                <Td>{st.name}</Td>
                <Td>{humanize(st.kind)}</Td>
                <Td>{st.capabilities.map((c) => STAGE_MODE_LABELS[c] ?? c).join(", ")}</Td>
                <Td numeric>{st.tankVolumeL === null ? "—" : `${st.tankVolumeL} L`}</Td>
              </tr>
            ))}
          </TBody>
        </Table>
        {can(user.roles, "systems.manage") && (
          <details className="mt-4">
            <summary className="cursor-pointer text-sm font-medium text-brand-800">Edit system and stages</summary>
            <div className="mt-3">
              <SystemEditor action={updateSystemAction} system={system} />
            </div>
          </details>
        )}
      </section>
      {can(user.roles, "recipe.edit") && system.active && (
        <p className="mb-4">
          <Link href={`/systems/${system.id}/recipes/new`} className="text-sm font-medium text-brand-800 hover:underline">
            New recipe for {system.code}
          </Link>
        </p>
      )}
      {system.recipes.map((recipe) => {
        const v = recipe.effectiveVersion;
        return (
          <section key={recipe.id} className="mb-8 rounded-lg border border-stone-200 bg-white p-5" aria-labelledby={`r-${recipe.id}`}>
            <h2 id={`r-${recipe.id}`} className="text-lg font-semibold">
              <Link href={`/systems/recipes/${recipe.id}`} className="text-brand-800 hover:underline">
                {recipe.code} · {recipe.name}
              </Link>
            </h2>
            <p className="text-sm text-stone-600">
              {v ? `Effective version ${v.version} since ${formatDate(v.effectiveFrom)} · detergent: ${v.detergent ?? "none"}` : "No effective version"}
            </p>
            {v && <RecipeTable content={v} caption={`Parameters of ${recipe.name}, version ${v.version}`} />}
          </section>
        );
      })}
    </>
  );
}
