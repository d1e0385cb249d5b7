import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { Caution } from "@/components/ui/caution";
import { PageHeader } from "@/components/ui/page-header";
import { humanize, rangeWithUnit, STAGE_MODE_LABELS, withUnit } from "@/lib/format/labels";
import { hazardsOfParameters } from "@/lib/recipes/hazards";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getCleaningSystem } from "@/lib/server/plant/queries";

export const metadata: Metadata = { title: "Cleaning system" };

export default async function SystemPage({ params }: { params: Promise<{ systemId: string }> }) {
  await requirePageUser("systems.view");
  const { systemId } = await params;
  const system = await getCleaningSystem(systemId);
  if (!system) notFound();
  return (
    <>
      <PageHeader title={`${system.code} · ${system.name}`} description={system.description ?? undefined} />
      {system.recipes.map((recipe) => {
        const v = recipe.effectiveVersion;
        const hazards = v ? hazardsOfParameters(v.stages.flatMap((s) => s.parameters.map((p) => ({ ...p, mode: s.mode })))) : [];
        return (
          <section key={recipe.id} className="mb-8 rounded-lg border border-stone-200 bg-white p-5" aria-labelledby={`r-${recipe.id}`}>
            <h2 id={`r-${recipe.id}`} className="text-lg font-semibold">
              {recipe.code} · {recipe.name}
            </h2>
            <p className="text-sm text-stone-600">
              {v ? `Effective version ${v.version} since ${v.effectiveFrom?.slice(0, 10)} · detergent: ${v.detergent ?? "none"}` : "No effective version"}
            </p>
            {hazards.length > 0 && (
              <div className="mt-3 space-y-2">
                {hazards.map((h) => (
                  <Caution key={h.kind} title={h.title}>
                    {h.text}
                  </Caution>
                ))}
              </div>
            )}
            {v && (
              <table className="mt-4 w-full text-sm">
                <caption className="sr-only">Parameters of {recipe.name}, version {v.version}</caption>
                <thead className="border-b border-stone-200 text-left text-xs text-stone-500 uppercase">
                  <tr>
                    <th className="py-1.5 pr-3 font-medium">Stage</th>
                    <th className="py-1.5 pr-3 font-medium">Parameter</th>
                    <th className="py-1.5 pr-3 text-right font-medium">Setpoint</th>
                    <th className="py-1.5 pr-3 font-medium">Validated range</th>
                    <th className="py-1.5 font-medium">Critical</th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-stone-100">
                  {v.stages.flatMap((stage) =>
                    stage.parameters.map((p, i) => (
                      <tr key={p.id}>
                        <td className="py-1.5 pr-3 align-top">
                          {i === 0 ? `${stage.name}${stage.mode ? ` (${STAGE_MODE_LABELS[stage.mode]})` : ""}` : ""}
                        </td>
                        <td className="py-1.5 pr-3">{p.name}</td>
                        <td className="py-1.5 pr-3 text-right tabular-nums">{withUnit(p.setpoint, p.unit)}</td>
                        <td className="py-1.5 pr-3 tabular-nums">{rangeWithUnit(p.validatedLow, p.validatedHigh, p.unit)}</td>
                        <td className="py-1.5">{p.critical ? "Critical" : "—"}</td>
                      </tr>
                    )),
                  )}
                </tbody>
              </table>
            )}
          </section>
        );
      })}
      <p className="text-xs text-stone-500">Stage kinds: {[...new Set(system.stages.map((s) => humanize(s.kind)))].join(", ")}.</p>
    </>
  );
}
