import type { Metadata } from "next";
import Link from "next/link";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { humanize, STAGE_MODE_LABELS } from "@/lib/format/labels";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listCleaningSystems } from "@/lib/server/plant/queries";

export const metadata: Metadata = { title: "Cleaning systems" };

export default async function SystemsPage() {
  await requirePageUser("systems.view");
  const systems = await listCleaningSystems();
  return (
    <>
      <PageHeader title="Cleaning systems" description="The plant's washers, their stages and the recipes they run." />
      {systems.length === 0 ? (
        <EmptyState title="No cleaning systems">An administrator adds the plant&apos;s washers and their stages.</EmptyState>
      ) : (
        <div className="grid gap-4 xl:grid-cols-2">
          {systems.map((s) => (
            <section key={s.id} className="rounded-lg border border-stone-200 bg-white p-5" aria-labelledby={`sys-${s.id}`}>
              <div className="flex items-baseline justify-between gap-3">
                <h2 id={`sys-${s.id}`} className="text-lg font-semibold">
                  <Link href={`/systems/${s.id}`} className="text-brand-800 hover:underline">
                    {s.code} · {s.name}
                  </Link>
                </h2>
                <span className="text-xs text-stone-600">{s.siteName}</span>
              </div>
              {s.description && <p className="mt-1 text-sm text-stone-600">{s.description}</p>}
              <table className="mt-4 w-full text-sm">
                <caption className="sr-only">Stages of {s.name}</caption>
                <thead className="text-left text-xs text-stone-500 uppercase">
                  <tr>
                    <th className="py-1 pr-3 font-medium">#</th>
                    <th className="py-1 pr-3 font-medium">Stage</th>
                    <th className="py-1 pr-3 font-medium">Kind</th>
                    <th className="py-1 font-medium">Can run</th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-stone-100">
                  {s.stages.map((st) => (
                    <tr key={st.id}>
                      <td className="py-1.5 pr-3 tabular-nums">{st.position}</td>
                      <td className="py-1.5 pr-3">{st.name}</td>
                      <td className="py-1.5 pr-3">{humanize(st.kind)}</td>
                      <td className="py-1.5">{st.capabilities.map((c) => STAGE_MODE_LABELS[c] ?? c).join(", ")}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
              <p className="mt-3 text-sm text-stone-700">
                Recipes:{" "}
                {s.recipes.length === 0
                  ? "none"
                  : s.recipes.map((r, i) => (
                      <span key={r.id}>
                        {i > 0 && "; "}
                        <Link href={`/systems/recipes/${r.id}`} className="text-brand-800 hover:underline">
                          {r.code} {r.name}
                        </Link>
                      </span>
                    ))}
              </p>
            </section>
          ))}
        </div>
      )}
    </>
  );
}
