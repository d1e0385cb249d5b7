import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { SpecChangeOffer } from "@/components/parts/spec-change-offer";
import { SpecForm } from "@/components/parts/spec-form";
import { PageHeader } from "@/components/ui/page-header";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { formatDate } from "@/lib/format/date";
import { withUnit } from "@/lib/format/number";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { familyOptions, getSpecWithHistory } from "@/lib/server/plant/parts-queries";
import { specChangeCandidates } from "@/lib/server/plant/open-spec-change";
import { openSpecChangeAction, reviseSpecAction } from "../../actions";
import { recordTitle } from "@/lib/server/page-titles";

export async function generateMetadata({
  params,
}: {
  params: Promise<{ specId: string }>;
}): Promise<Metadata> {
  return recordTitle("spec", (await params).specId, "Specification");
}

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
  const changeControl = await specChangeCandidates(spec.id);
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
                    <IntentLink
                      href={`/parts/families/${f.id}`}
                      className="text-brand-800 underline"
                    >
                      {f.code}
                    </IntentLink>
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
                      <IntentLink
                        href={`/parts/specs/${r.id}`}
                        className="text-brand-800 underline"
                      >
                        {r.revision}
                      </IntentLink>
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
      {changeControl && changeControl.comparison.changes.length > 0 && (
        <section aria-labelledby="spec-change" className="mb-8">
          <h2 id="spec-change" className="mb-1 text-lg font-semibold">
            Change control for this revision
          </h2>
          <p className="mb-2 max-w-3xl text-sm text-stone-600">
            {changeControl.comparison.tightens
              ? "This revision tightens a limit: each recipe qualified to it needs a major change request of kind \u201cspecification\u201d, with requalification evidence against the new limit."
              : "This revision loosens or rewords its limits: each recipe qualified to it needs a minor change request of kind \u201cspecification\u201d, approved before the new revision is relied on."}
          </p>
          <ul className="mb-3 list-disc pl-5 text-sm">
            {changeControl.comparison.changes.map((c) => (
              <li key={c.field}>{c.reason}</li>
            ))}
          </ul>
          <Table caption="Recipes qualified to this revision" captionVisible density="compact">
            <THead>
              <Th>Recipe</Th>
              <Th>Effective version</Th>
              <Th>Change request</Th>
            </THead>
            <TBody>
              {changeControl.recipes.length === 0 && (
                <tr>
                  <Td colSpan={3}>No recipe is qualified for a part family on this revision.</Td>
                </tr>
              )}
              {changeControl.recipes.map((r) => (
                <tr key={r.recipeId}>
                  <Td className="font-mono text-xs">{r.code}</Td>
                  <Td numeric>{r.version}</Td>
                  <Td>
                    <SpecChangeOffer
                      action={openSpecChangeAction}
                      specId={spec.id}
                      recipe={r}
                      canOpen={can(user.roles, "change.draft")}
                    />
                  </Td>
                </tr>
              ))}
            </TBody>
          </Table>
        </section>
      )}
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
