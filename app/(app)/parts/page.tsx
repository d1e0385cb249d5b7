import type { Metadata } from "next";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { formatNumber, withUnit } from "@/lib/format/number";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listPartFamilies, listSpecs } from "@/lib/server/plant/queries";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

export const metadata: Metadata = { title: "Parts & specifications" };

export default async function PartsPage() {
  await requirePageUser("parts.view");
  const [families, specs] = await Promise.all([listPartFamilies(), listSpecs()]);
  return (
    <>
      <PageHeader
        title="Parts & specifications"
        description="Part families with their wetted surface and the cleanliness specification each must meet."
      />
      {families.length === 0 ? (
        <EmptyState title="No part families">Engineers add part families with their material, wetted area and specification.</EmptyState>
      ) : (
        <section aria-labelledby="families" className="mb-8">
          <h2 id="families" className="mb-2 text-base font-semibold">Part families</h2>
          <Table>
            <THead>
              <Th>Code</Th>
              <Th>Name</Th>
              <Th>Material</Th>
              <Th align="right">Wetted area</Th>
              <Th>Specification</Th>
            </THead>
            <TBody>
              {families.map(({ family, spec }) => (
                <tr key={family.id}>
                  <Td className="font-mono text-xs">{family.code}</Td>
                  <Td>{family.name}</Td>
                  <Td>{family.material}</Td>
                  <Td numeric>{formatNumber(family.wettedAreaCm2, 1)} cm²</Td>
                  <Td>{spec.code}</Td>
                </tr>
              ))}
            </TBody>
          </Table>
        </section>
      )}
      <section aria-labelledby="specs">
        <h2 id="specs" className="mb-2 text-base font-semibold">Cleanliness specifications</h2>
        <div className="grid gap-4 lg:grid-cols-2">
          {specs.map((s) => (
            <article key={s.id} className="rounded-lg border border-stone-200 bg-white p-4 text-sm">
              <h3 className="font-semibold">
                {s.code} · {s.name}
              </h3>
              <dl className="mt-2 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1">
                <dt className="text-stone-500">Particle limits (CCC)</dt>
                <dd className="font-mono text-xs">{s.ccc}</dd>
                <dt className="text-stone-500">Largest metallic</dt>
                <dd>{withUnit(s.maxMetallicUm, "µm")}</dd>
                <dt className="text-stone-500">Largest non-metallic</dt>
                <dd>{withUnit(s.maxNonMetallicUm, "µm")}</dd>
                <dt className="text-stone-500">Largest fibre</dt>
                <dd>{withUnit(s.maxFibreUm, "µm")}</dd>
                <dt className="text-stone-500">Residue (gravimetric)</dt>
                <dd>
                  {s.gravimetricLimitMg === null
                    ? "—"
                    : `≤ ${withUnit(s.gravimetricLimitMg, "mg")} ${s.gravimetricBasis === "per_1000_cm2" ? "per 1000 cm²" : "per component"}`}
                </dd>
                <dt className="text-stone-500">Wetting tension</dt>
                <dd>{s.minWettingTensionMNm === null ? "—" : `≥ ${withUnit(s.minWettingTensionMNm, "mN/m")}`}</dd>
                <dt className="text-stone-500">Visual</dt>
                <dd>{s.visualCriteria ?? "—"}</dd>
                <dt className="text-stone-500">Dryness</dt>
                <dd>{s.drynessCriteria ?? "—"}</dd>
              </dl>
            </article>
          ))}
        </div>
      </section>
    </>
  );
}
