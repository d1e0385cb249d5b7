import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { SpecForm } from "@/components/parts/spec-form";
import { PageHeader } from "@/components/ui/page-header";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { formatDate } from "@/lib/format/date";
import { withUnit } from "@/lib/format/number";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { familyOptions, getSpecWithHistory } from "@/lib/server/plant/parts-queries";
import { reviseSpecAction } from "../../actions";

export const metadata: Metadata = { title: "Specification" };

const BASIS = { per_component: "per part", per_1000_cm2: "per 1000 cm²" } as const;

export default async function SpecPage({ params }: { params: Promise<{ specId: string }> }) {
  const user = await requirePageUser("parts.view");
  const id = z.uuid().safeParse((await params).specId);
  if (!id.success) notFound();
  const found = await getSpecWithHistory(id.data);
  if (!found) notFound();
  const { spec, revisions, families } = found;
  const revisable = spec.status === "in_force" && can(user.roles, "parts.manage");
  const allFamilies = revisable ? await familyOptions() : [];
  const rows: [string, string][] = [
    ["Customer", spec.customer ?? "—"],
    [
      "Customer document",
      spec.documentNumber ? `${spec.documentNumber} rev ${spec.revision}` : `rev ${spec.revision}`,
    ],
    [
      "Status",
      spec.status === "in_force" ? "In force" : `Superseded ${formatDate(spec.supersededAt)}`,
    ],
    ["Cleanliness code", spec.ccc],
    ["Largest metallic particle", withUnit(spec.maxMetallicUm, "µm")],
    ["Largest non-metallic particle", withUnit(spec.maxNonMetallicUm, "µm")],
    ["Largest fibre", withUnit(spec.maxFibreUm, "µm")],
    [
      "Gravimetric limit",
      spec.gravimetricLimitMg === null
        ? "—"
        : `≤ ${withUnit(spec.gravimetricLimitMg, "mg")} ${BASIS[spec.gravimetricBasis ?? "per_component"]}`,
    ],
    [
      "Minimum wetting tension",
      spec.minWettingTensionMNm === null ? "—" : `≥ ${withUnit(spec.minWettingTensionMNm, "mN/m")}`,
    ],
    ["Visual", spec.visualCriteria ?? "—"],
    ["Dryness", spec.drynessCriteria ?? "—"],
    ["Extra requirements", spec.extraRequirements ?? "—"],
    ["Customer approves process changes", spec.customerApprovesChanges ? "Yes" : "No"],
  ];
  return (
    <>
      <PageHeader title={`${spec.code} rev ${spec.revision} · ${spec.name}`} />
      <div className="mb-8 grid gap-6 lg:grid-cols-2">
        <section
          aria-labelledby="limits"
          className="rounded-lg border border-stone-200 bg-white p-4 text-sm"
        >
          <h2 id="limits" className="mb-2 font-semibold">
            Limits
          </h2>
          <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1">
            {rows.map(([k, v]) => (
              <div key={k} className="contents">
                <dt className="text-stone-500">{k}</dt>
                <dd className={k === "Cleanliness code" ? "font-mono text-xs" : undefined}>{v}</dd>
              </div>
            ))}
            <dt className="text-stone-500">Source document</dt>
            <dd>
              {spec.sourceFileId ? (
                <a
                  className="text-brand-800 underline"
                  href={`/api/evidence/files/${spec.sourceFileId}`}
                >
                  Download
                </a>
              ) : (
                "not uploaded"
              )}
            </dd>
          </dl>
        </section>
        <div className="space-y-6">
          <Table caption="Part families on this revision" captionVisible density="compact">
            <THead>
              <Th>Code</Th>
              <Th>Name</Th>
            </THead>
            <TBody>
              {families.length === 0 && (
                <tr>
                  <Td colSpan={2}>None.</Td>
                </tr>
              )}
              {families.map((f) => (
                <tr key={f.id}>
                  <Td className="font-mono text-xs">
                    <Link href={`/parts/families/${f.id}`} className="text-brand-800 underline">
                      {f.code}
                    </Link>
                  </Td>
                  <Td>{f.name}</Td>
                </tr>
              ))}
            </TBody>
          </Table>
          <Table caption="Revisions" captionVisible density="compact">
            <THead>
              <Th>Revision</Th>
              <Th>Status</Th>
              <Th>Registered</Th>
            </THead>
            <TBody>
              {revisions.map((r) => (
                <tr key={r.id}>
                  <Td>
                    {r.id === spec.id ? (
                      <span aria-current="page">{r.revision}</span>
                    ) : (
                      <Link href={`/parts/specs/${r.id}`} className="text-brand-800 underline">
                        {r.revision}
                      </Link>
                    )}
                  </Td>
                  <Td>{r.status === "in_force" ? "In force" : "Superseded"}</Td>
                  <Td>{formatDate(r.createdAt)}</Td>
                </tr>
              ))}
            </TBody>
          </Table>
        </div>
      </div>
      {revisable && (
        <section aria-labelledby="revise">
          <h2 id="revise" className="mb-1 text-lg font-semibold">
            New revision
          </h2>
          <p className="mb-4 max-w-3xl text-sm text-stone-600">
            The customer issued a new revision: enter its limits in full. It supersedes revision{" "}
            {spec.revision}, and the part families on it move to the new one. A tightened limit
            lists the families and recipe versions validated against the looser one.
          </p>
          <SpecForm action={reviseSpecAction} values={spec} families={allFamilies} revising />
        </section>
      )}
    </>
  );
}
