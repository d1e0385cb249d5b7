import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { PageNav } from "@/components/ui/page-nav";
import { linkButton } from "@/components/parts/link-styles";
import { ListFilterForm } from "@/components/ui/list-filter-form";
import { PageHeader } from "@/components/ui/page-header";
import { EmptyRow, TBody, Table, Td, Th, THead } from "@/components/ui/table";
import { can } from "@/lib/auth/permissions";
import { CONTROL_PLAN_STATUS_LABELS } from "@/lib/control-plans/characteristics";
import { formatDate } from "@/lib/format/date";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { CONTROL_PLAN_PAGE_SIZE, listControlPlans } from "@/lib/server/control-plans/queries";

export const metadata: Metadata = { title: "Control plans" };

/** The control plan register, one per qualified combination; the filter and page live in the URL. */
export default async function ControlPlansPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const user = await requirePageUser("control_plan.view");
  const sp = await searchParams;
  const q = (typeof sp.q === "string" ? sp.q.trim() : "").slice(0, 60);
  const requested = Number(typeof sp.page === "string" ? sp.page : "1");
  const page =
    Number.isInteger(requested) && requested >= 1 && requested <= 100_000 ? requested : 1;
  const { rows, total } = await listControlPlans({ q, page });
  const pages = Math.max(1, Math.ceil(total / CONTROL_PLAN_PAGE_SIZE));
  const pageHref = (n: number) =>
    `/control-plans?${new URLSearchParams({ ...(q ? { q } : {}), page: String(n) })}`;
  return (
    <>
      <PageHeader
        title="Control plans"
        description="For each qualified combination of recipe version and part family: which characteristic is tested, how, on how many parts, how often, and what to do when a result is out. An approved plan schedules the routine tests in My queue."
        actions={
          can(user.roles, "control_plan.draft") ? (
            <IntentLink href="/control-plans/new" className={linkButton}>
              New control plan
            </IntentLink>
          ) : undefined
        }
      />
      <ListFilterForm
        label="Filter control plans"
        action="/control-plans"
        filters={[{ name: "q", label: "Recipe or part family code", value: q }]}
      />
      <Table caption="Control plans">
        <THead>
          <Th>Combination</Th>
          <Th>Washer</Th>
          <Th>Part family</Th>
          <Th>In force</Th>
          <Th>Newest version</Th>
        </THead>
        <TBody>
          {rows.length === 0 && <EmptyRow colSpan={5}>No control plan matches.</EmptyRow>}
          {rows.map((r) => (
            <tr key={r.id}>
              <Td>
                <IntentLink href={`/control-plans/${r.id}`} className="text-brand-800 underline">
                  {r.combination}
                </IntentLink>
                {r.versionStatus !== "effective" && (
                  <span className="block text-xs text-stone-600">
                    Recipe version {r.versionStatus}: no tests are scheduled
                  </span>
                )}
              </Td>
              <Td>{r.systemCode}</Td>
              <Td>{r.familyName}</Td>
              <Td>
                {r.effective
                  ? `Version ${r.effective.version} since ${formatDate(r.effective.effectiveAt)}`
                  : "None approved yet"}
              </Td>
              <Td>
                {r.latest
                  ? `Version ${r.latest.version}: ${CONTROL_PLAN_STATUS_LABELS[r.latest.status]}`
                  : "—"}
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
      {pages > 1 && (
        <PageNav
          label="Pages of the control plans"
          page={page}
          pages={pages}
          summary={`${total} plans`}
          href={pageHref}
        />
      )}
    </>
  );
}
