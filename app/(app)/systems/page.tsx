import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { humanize, STAGE_MODE_LABELS } from "@/lib/format/labels";
import { can } from "@/lib/auth/permissions";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listCleaningSystems } from "@/lib/server/plant/queries";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

export const metadata: Metadata = { title: "Cleaning systems" };

export default async function SystemsPage() {
  const user = await requirePageUser("systems.view");
  const systems = await listCleaningSystems();
  const manage = can(user.roles, "systems.manage");
  return (
    <>
      <PageHeader
        title="Cleaning systems"
        description="The plant's washers, their stages and the recipes they run."
        actions={
          manage && (
            <IntentLink
              href="/systems/new"
              className="rounded-md bg-brand-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-brand-800"
            >
              New cleaning system
            </IntentLink>
          )
        }
      />
      {systems.length === 0 ? (
        <EmptyState title="No cleaning systems">
          {manage
            ? "Add the plant's first washer with New cleaning system."
            : "An administrator adds the plant's washers and their stages."}
        </EmptyState>
      ) : (
        <div className="grid gap-4 xl:grid-cols-2">
          {systems.map((s) => (
            <section
              key={s.id}
              className="rounded-lg border border-stone-200 bg-white p-5"
              aria-labelledby={`sys-${s.id}`}
            >
              <div className="flex items-baseline justify-between gap-3">
                <h2 id={`sys-${s.id}`} className="text-lg font-semibold">
                  <IntentLink href={`/systems/${s.id}`} className="text-brand-800 hover:underline">
                    {s.code} · {s.name}
                  </IntentLink>
                </h2>
                <span className="text-xs text-stone-600">
                  {s.active ? "In service" : "Retired"} · {s.siteName}
                  {s.assetNumber && ` · asset ${s.assetNumber}`}
                </span>
              </div>
              {s.description && <p className="mt-1 text-sm text-stone-600">{s.description}</p>}
              <Table density="compact" caption={<>Stages of {s.name}</>} frameClassName="mt-4">
                <THead>
                  <Th>#</Th>
                  <Th>Stage</Th>
                  <Th>Kind</Th>
                  <Th>Can run</Th>
                </THead>
                <TBody>
                  {s.stages.map((st) => (
                    <tr key={st.id}>
                      <Td className="tabular-nums">{st.position}</Td>
                      <Td>{st.name}</Td>
                      <Td>{humanize(st.kind)}</Td>
                      <Td>{st.capabilities.map((c) => STAGE_MODE_LABELS[c] ?? c).join(", ")}</Td>
                    </tr>
                  ))}
                </TBody>
              </Table>
              <p className="mt-3 text-sm text-stone-700">
                Recipes:{" "}
                {s.recipes.length === 0
                  ? "none"
                  : s.recipes.map((r, i) => (
                      <span key={r.id}>
                        {i > 0 && "; "}
                        <IntentLink
                          href={`/systems/recipes/${r.id}`}
                          className="text-brand-800 hover:underline"
                        >
                          {r.code} {r.name}
                        </IntentLink>
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
