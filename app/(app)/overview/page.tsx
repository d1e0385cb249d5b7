import type { Metadata } from "next";
import { IntentLink } from "@/components/ui/intent-link";
import { OverdueTable } from "@/components/overview/overdue-table";
import { SummaryTiles } from "@/components/overview/summary-tiles";
import { OverviewStateWord } from "@/components/overview/state-word";
import { WasherCard } from "@/components/overview/washer-card";
import { Caution } from "@/components/ui/caution";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { formatDateTime } from "@/lib/format/date";
import { worstState } from "@/lib/overview/state";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { loadPlantOverview } from "@/lib/server/overview/load-overview";

export const metadata: Metadata = { title: "Plant overview" };

export default async function OverviewPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  await requirePageUser("overview.view");
  const sp = await searchParams;
  const page = typeof sp.page === "string" && /^\d{1,4}$/.test(sp.page) ? Number(sp.page) : 1;
  const now = new Date();
  const overview = await loadPlantOverview({ page, now });
  const pageState = worstState(overview.washers.map((w) => w.state.state));
  const anyTankBeyond = overview.washers.some((w) =>
    w.tanks.some((t) => t.state === "action" || t.state === "reject"),
  );
  return (
    <>
      <PageHeader
        title="Plant overview"
        description={`Each washer's baths, checks and latest verified results by part family, with what is open or overdue. As of ${formatDateTime(now)}.`}
      />
      <SummaryTiles summary={overview.summary} />
      {overview.totalWashers === 0 ? (
        <EmptyState title="No cleaning system yet">
          The overview fills in once an administrator adds the plant&apos;s washers under{" "}
          <IntentLink href="/systems" className="text-brand-800 underline">
            Cleaning systems
          </IntentLink>
          .
        </EmptyState>
      ) : (
        <section aria-labelledby="washers-title" className="mt-8 space-y-4">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h2 id="washers-title" className="text-lg font-semibold text-stone-900">
              Washers
            </h2>
            <p className="flex items-center gap-2 text-sm text-stone-700">
              {overview.pages > 1 ? "On this page:" : "Plant:"}{" "}
              <OverviewStateWord state={pageState} />
            </p>
          </div>
          {anyTankBeyond && (
            <Caution title="correcting a bath">
              Wash baths run hot and alkaline or acidic. Top up, dump or recharge a bath only as the
              washer&apos;s procedure says, with the machine isolated where it asks, and with the
              protective equipment the detergent&apos;s safety data sheet names.
            </Caution>
          )}
          {overview.washers.map((w) => (
            <WasherCard key={w.id} washer={w} />
          ))}
          {overview.pages > 1 && (
            <nav aria-label="Washer pages" className="flex items-center gap-3 text-sm">
              {overview.page > 1 && (
                <IntentLink
                  href={`/overview?page=${overview.page - 1}`}
                  className="text-brand-800 underline"
                >
                  Previous washers
                </IntentLink>
              )}
              <span>
                Page {overview.page} of {overview.pages} ({overview.totalWashers} washers)
              </span>
              {overview.page < overview.pages && (
                <IntentLink
                  href={`/overview?page=${overview.page + 1}`}
                  className="text-brand-800 underline"
                >
                  Next washers
                </IntentLink>
              )}
            </nav>
          )}
        </section>
      )}
      <OverdueTable items={overview.overdue} counts={overview.summary.overdue} />
      {overview.plantWide.length > 0 && (
        <section aria-labelledby="plant-wide-title" className="mt-8">
          <h2 id="plant-wide-title" className="text-lg font-semibold text-stone-900">
            Open nonconformances not tied to a washer
          </h2>
          <ul className="mt-2 space-y-1 text-sm">
            {overview.plantWide.map((i) => (
              <li key={i.id}>
                <IntentLink
                  href={i.href}
                  className="text-brand-800 underline-offset-2 hover:underline"
                >
                  {i.number}
                </IntentLink>{" "}
                {i.title} · {i.status}
              </li>
            ))}
          </ul>
        </section>
      )}
    </>
  );
}
