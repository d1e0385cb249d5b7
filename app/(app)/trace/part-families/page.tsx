import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { EmptyState } from "@/components/ui/empty-state";
import { SelectField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { humanize } from "@/lib/format/labels";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { partFamilyQuerySchema } from "@/lib/schemas/trace";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getPartFamilyHistory, listPartFamilies } from "@/lib/server/trace/part-family-history";
import { NcPanel } from "@/components/nonconformances/nc-panel";
import { OUTCOME_LABELS } from "@/lib/trace/labels";
import { formatDate, formatDateTime } from "@/lib/format/date";
import { TBody, Table, Td, Th, THead } from "@/components/ui/table";

export const metadata: Metadata = { title: "Part family history" };

export default async function PartFamilyTracePage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("trace.view");
  const q = partFamilyQuerySchema.safeParse(await searchParams);
  const familyId = q.success ? q.data.family : undefined;
  const [families, history] = await Promise.all([
    listPartFamilies(),
    familyId ? getPartFamilyHistory(familyId) : undefined,
  ]);
  return (
    <>
      <PageHeader
        title="Part family history"
        description="Which recipe versions cleaned a part family, when, and with which test results."
      />
      <form
        method="get"
        className="mb-8 flex flex-wrap items-end gap-3 rounded-lg border border-stone-200 bg-white p-5"
        aria-label="Choose a part family"
      >
        <SelectField
          name="family"
          label="Part family"
          defaultValue={familyId ?? ""}
          placeholder="Choose…"
          className="w-72"
          options={families.map((f) => ({ value: f.id, label: `${f.code} · ${f.name}` }))}
        />
        <button
          type="submit"
          className="rounded-md bg-brand-700 px-3.5 py-2 text-sm font-medium text-white hover:bg-brand-800"
        >
          Show history
        </button>
      </form>
      {!familyId ? (
        <EmptyState title="No part family chosen">
          Choose a part family to see the recipe versions that cleaned it and the results of its
          tests.
        </EmptyState>
      ) : !history ? (
        <EmptyState title="Part family not found">Choose one from the list.</EmptyState>
      ) : (
        <section aria-labelledby="family-h">
          <h2 id="family-h" className="text-lg font-semibold">
            {history.family.code} · {history.family.name}
          </h2>
          <p className="mb-4 text-sm text-stone-700">
            {history.family.material} · wetted area {history.family.wettedAreaCm2} cm² ·
            specification {history.spec.code} {history.spec.ccc}
          </p>
          {history.versions.length === 0 ? (
            <EmptyState title="No recipe version recorded">
              No recipe version has been validated for this family and no test run names it yet.
            </EmptyState>
          ) : (
            <ol className="space-y-4" aria-label="Recipe versions that cleaned this family">
              {history.versions.map((v) => (
                <li key={v.id} className="rounded-lg border border-stone-200 bg-white p-5">
                  <h3 className="font-semibold">
                    <IntentLink
                      href={`/systems/recipes/${v.recipe.id}`}
                      className="text-brand-800 hover:underline"
                    >
                      {v.recipe.code}
                    </IntentLink>{" "}
                    version {v.version} · {humanize(v.status)}
                  </h3>
                  <p className="text-sm text-stone-700">
                    {v.recipe.name} on {v.system.code} · in force{" "}
                    {v.effectiveFrom
                      ? `from ${formatDateTime(v.effectiveFrom)} ${v.effectiveTo ? `to ${formatDateTime(v.effectiveTo)}` : "until now"}`
                      : "never (not made effective)"}
                    {v.interval
                      ? ` · last qualified ${formatDate(v.interval.lastQualifiedAt)}, requalify every ${v.interval.intervalMonths} months`
                      : ""}
                  </p>
                  {v.runs.length === 0 ? (
                    <p className="mt-2 text-sm text-stone-600">
                      No test run on this version for the family.
                    </p>
                  ) : (
                    <Table
                      density="compact"
                      caption={
                        <>
                          Test runs of {history.family.code} on {v.recipe.code} version {v.version}
                        </>
                      }
                      frameClassName="mt-2"
                    >
                      <THead>
                        <Th>Run</Th>
                        <Th>Test</Th>
                        <Th>Performed</Th>
                        <Th>Status</Th>
                        <Th>Computed outcome</Th>
                        <Th>Change request</Th>
                      </THead>
                      <TBody>
                        {v.runs.map((r) => (
                          <tr key={r.id}>
                            <Td className="font-medium">
                              {r.number}
                              {r.revision > 1 ? ` rev. ${r.revision}` : ""}
                            </Td>
                            <Td>{TEST_TYPE_LABELS[r.testType]}</Td>
                            <Td>{r.performedOn ?? "—"}</Td>
                            <Td>{humanize(r.status)}</Td>
                            <Td className="font-semibold">
                              {r.outcome ? OUTCOME_LABELS[r.outcome] : "Not computed"}
                            </Td>
                            <Td>
                              {r.changeRequestId && r.changeNumber ? (
                                <IntentLink
                                  href={`/changes/${r.changeRequestId}`}
                                  className="text-brand-800 hover:underline"
                                >
                                  {r.changeNumber}
                                </IntentLink>
                              ) : (
                                "—"
                              )}
                            </Td>
                          </tr>
                        ))}
                      </TBody>
                    </Table>
                  )}
                </li>
              ))}
            </ol>
          )}
          <p className="mt-4 text-xs text-stone-600">
            A computed pass supports, and never replaces, the customer&apos;s specification and the
            engineer&apos;s judgement.
          </p>
          <NcPanel roles={user.roles} where={{ partFamilyId: history.family.id }} />
        </section>
      )}
    </>
  );
}
