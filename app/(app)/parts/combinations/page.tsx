import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { QualifyForm } from "@/components/parts/qualify-form";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { formatDate, todayUtc } from "@/lib/format/date";
import { requirePageUser } from "@/lib/server/auth/current-user";
import {
  familyOptions,
  listCombinations,
  qualifiableVersions,
} from "@/lib/server/plant/parts-queries";
import { qualifyCombinationAction } from "../actions";

export const metadata: Metadata = { title: "Qualified combinations" };

/** Which recipe version is validated for which part family: a run opens only on one of these. */
export default async function CombinationsPage() {
  const user = await requirePageUser("parts.view");
  const manage = can(user.roles, "parts.manage");
  const [combos, versions, families] = await Promise.all([
    listCombinations(),
    manage ? qualifiableVersions() : [],
    manage ? familyOptions() : [],
  ]);
  return (
    <>
      <PageHeader
        title="Qualified combinations"
        description="Each recipe version validated for a part family, on what evidence, and when it is due for periodic requalification. A test run opens only on a qualified combination, or under a validation protocol for it."
      />
      <Table caption="Qualified combinations">
        <THead>
          <Th>Part family</Th>
          <Th>Recipe version</Th>
          <Th>Basis</Th>
          <Th>Qualified on</Th>
          <Th align="right">Interval</Th>
          <Th>Due</Th>
          <Th>Recorded by</Th>
        </THead>
        <TBody>
          {combos.length === 0 && <EmptyRow colSpan={7}>No combination is qualified yet.</EmptyRow>}
          {combos.map((c) => (
            <tr key={c.id}>
              <Td>
                <span className="font-mono text-xs">{c.familyCode}</span> · {c.familyName}
              </Td>
              <Td>
                <IntentLink
                  href={`/systems/recipes/${c.recipeId}`}
                  className="text-brand-800 underline"
                >
                  {c.recipeCode} v{c.recipeVersion}
                </IntentLink>{" "}
                ({c.recipeVersionStatus})
              </Td>
              <Td>{c.basis ?? "carried over by a change"}</Td>
              <Td>{formatDate(c.lastQualifiedAt)}</Td>
              <Td numeric>{c.intervalMonths} months</Td>
              <Td>{formatDate(c.dueAt)}</Td>
              <Td>{c.qualifiedBy ?? "—"}</Td>
            </tr>
          ))}
        </TBody>
      </Table>
      {manage && (
        <section aria-labelledby="qualify" className="mt-8">
          <h2 id="qualify" className="mb-1 text-lg font-semibold">
            Qualify a combination by hand
          </h2>
          <p className="mb-4 max-w-3xl text-sm text-stone-600">
            For a recipe version already in use whose validation for this family is on record
            elsewhere (a report from before Washproof). New versions are qualified when their change
            request or initial validation closes.
          </p>
          <QualifyForm
            action={qualifyCombinationAction}
            versions={versions}
            families={families}
            today={todayUtc()}
          />
        </section>
      )}
    </>
  );
}
