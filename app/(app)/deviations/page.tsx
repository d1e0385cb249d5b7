import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { linkButton, secondaryLink } from "@/components/parts/link-styles";
import { Button } from "@/components/ui/button";
import { Field, SelectField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { DEVIATION_STATE_LABELS, RISK_LABELS } from "@/lib/deviations/rules";
import { formatDate } from "@/lib/format/date";
import { deviationListSchema } from "@/lib/schemas/deviation";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { listDeviations } from "@/lib/server/deviations/queries";

export const metadata: Metadata = { title: "Temporary deviations" };

/** The deviation register; its filter lives in the URL so a filtered list can be linked and reloaded. */
export default async function DeviationsPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("deviation.view");
  const raw = await searchParams;
  const query = deviationListSchema.parse({
    state: raw.state ?? "all",
    recipe: typeof raw.recipe === "string" ? raw.recipe.trim() : "",
  });
  const rows = await listDeviations(query);
  return (
    <>
      <PageHeader
        title="Temporary deviations"
        description="Planned, time-limited permissions to run outside a validated range, each approved by a second person and ended by its date or its number of lots."
        actions={
          can(user.roles, "deviation.draft") ? (
            <IntentLink href="/deviations/new" className={linkButton}>
              New deviation
            </IntentLink>
          ) : undefined
        }
      />
      <form
        method="get"
        className="mb-4 flex flex-wrap items-end gap-3"
        aria-label="Filter deviations"
      >
        <SelectField
          name="state"
          label="State"
          dense
          defaultValue={query.state}
          options={[
            { value: "all", label: "All" },
            ...(["draft", "active", "expired", "withdrawn"] as const).map((s) => ({
              value: s,
              label: DEVIATION_STATE_LABELS[s],
            })),
          ]}
        />
        <Field
          name="recipe"
          label="Recipe code (or part of it)"
          dense
          defaultValue={query.recipe}
        />
        <Button type="submit" variant="secondary">
          Filter
        </Button>
        {(query.state !== "all" || query.recipe) && (
          <IntentLink href="/deviations" className={secondaryLink}>
            Clear
          </IntentLink>
        )}
      </form>
      <Table caption="Deviations">
        <THead>
          <Th>Number</Th>
          <Th>Title</Th>
          <Th>Recipe</Th>
          <Th>State</Th>
          <Th>Risk</Th>
          <Th>Last day</Th>
          <Th align="right">Lots used</Th>
          <Th>Drafted by</Th>
        </THead>
        <TBody>
          {rows.length === 0 && <EmptyRow colSpan={8}>No deviation matches.</EmptyRow>}
          {rows.map((r) => (
            <tr key={r.d.id}>
              <Td className="font-mono text-xs">
                <IntentLink href={`/deviations/${r.d.id}`} className="text-brand-800 underline">
                  {r.d.number}
                </IntentLink>
              </Td>
              <Td>{r.d.title}</Td>
              <Td>{r.recipe}</Td>
              <Td className="font-medium">{DEVIATION_STATE_LABELS[r.state]}</Td>
              <Td>{RISK_LABELS[r.d.riskLevel]}</Td>
              <Td>{formatDate(r.d.endsOn, "no end date")}</Td>
              <Td numeric>
                {r.lotsUsed}
                {r.d.maxLots !== null ? ` of ${r.d.maxLots}` : ""}
              </Td>
              <Td>{r.author}</Td>
            </tr>
          ))}
        </TBody>
      </Table>
    </>
  );
}
