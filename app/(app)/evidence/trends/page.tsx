import type { Metadata } from "next";
import { ControlChart } from "@/components/evidence/control-chart";
import { TrendChart } from "@/components/evidence/trend-chart";
import { EmptyState } from "@/components/ui/empty-state";
import { SelectField } from "@/components/ui/field";
import { PageHeader } from "@/components/ui/page-header";
import { ShowsItsPage } from "@/components/ui/shows-its-page";
import { SubmittingSelect } from "@/components/ui/submitting-select";
import { bathControlChart } from "@/lib/evidence/bath-chart";
import { BATH_VARIABLES, type BathVariable } from "@/lib/evidence/maintenance";
import { particleTrend } from "@/lib/evidence/trends";
import { requirePageUser } from "@/lib/server/auth/current-user";
import { getTank, listTanks } from "@/lib/server/bath/queries";
import {
  particleHistory,
  particleRunVersions,
  partFamilyChoices,
} from "@/lib/server/evidence/queries";

export const metadata: Metadata = { title: "Trends" };

const pick = (v: string | string[] | undefined) =>
  typeof v === "string" && /^[0-9a-f-]{36}$/.test(v) ? v : undefined;

export default async function TrendsPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  await requirePageUser("evidence.view");
  const sp = await searchParams;
  const families = await partFamilyChoices();
  const familyId = pick(sp.family) ?? families[0]?.id;
  // The versions this family's particle runs were washed with, superseded ones too.
  const versions = familyId ? await particleRunVersions(familyId) : [];
  // A version from another family's list (the family was changed) would hide every run: ignored.
  const versionId = versions.find((v) => v.id === pick(sp.version))?.id;
  const history = familyId ? await particleHistory(familyId, versionId) : null;
  const series = history?.family
    ? particleTrend(history.family.spec.ccc, history.family.family, history.runs)
    : null;

  const tanks = (await listTanks()).filter((t) => t.stage.tankVolumeL !== null);
  const stageId = pick(sp.tank) ?? tanks[0]?.stage.id;
  const variable: BathVariable =
    typeof sp.variable === "string" && sp.variable in BATH_VARIABLES
      ? (sp.variable as BathVariable)
      : "concentrationPct";
  const tank = stageId ? await getTank(stageId) : undefined;
  const chart = tank
    ? bathControlChart(
        tank.records.map((r) => ({ performedAt: r.record.performedAt, values: r.record })),
        variable,
        tank.plan.find((l) => l.variable === variable) ?? null,
      )
    : null;
  return (
    <>
      <PageHeader
        title="Trends"
        description="Cleanliness results over time against the specification, and control charts of monitored bath values."
      />
      <section aria-labelledby="particles-title" className="mb-10 space-y-3">
        <h2 id="particles-title" className="text-base font-semibold">
          Particle cleanliness by part family
        </h2>
        <form
          className="flex flex-wrap items-end gap-3"
          method="get"
          aria-label="Choose part family and recipe version"
          // Not refilled by the browser on Back: the fields show what the page shows.
          autoComplete="off"
        >
          <ShowsItsPage />
          <SubmittingSelect
            name="family"
            label="Part family"
            clears={["version"]}
            dense
            defaultValue={familyId}
            options={families.map((f) => ({ value: f.id, label: `${f.code} · ${f.name}` }))}
          />
          <SelectField
            name="version"
            label="Recipe version"
            dense
            defaultValue={versionId ?? ""}
            placeholder="All versions"
            options={versions.map((v) => ({ value: v.id, label: v.label }))}
          />
          {stageId && <input type="hidden" name="tank" value={stageId} />}
          <input type="hidden" name="variable" value={variable} />
          <button className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-100">
            Show
          </button>
        </form>
        {series && series.points.length > 0 ? (
          <TrendChart series={series} />
        ) : (
          <EmptyState title="No particle results yet">
            Particle cleanliness runs of this part family and recipe version appear here once
            samples are recorded.
          </EmptyState>
        )}
      </section>
      <section aria-labelledby="bath-title" className="space-y-3">
        <h2 id="bath-title" className="text-base font-semibold">
          Bath control chart
        </h2>
        <form
          className="flex flex-wrap items-end gap-3"
          method="get"
          aria-label="Choose tank and value"
          // Not refilled by the browser on Back: the fields show what the page shows.
          autoComplete="off"
        >
          <ShowsItsPage />
          {familyId && <input type="hidden" name="family" value={familyId} />}
          {versionId && <input type="hidden" name="version" value={versionId} />}
          <SelectField
            name="tank"
            label="Tank"
            dense
            defaultValue={stageId}
            options={tanks.map((t) => ({
              value: t.stage.id,
              label: `${t.system.code} · ${t.stage.name}`,
            }))}
          />
          <SelectField
            name="variable"
            label="Value"
            dense
            defaultValue={variable}
            options={Object.entries(BATH_VARIABLES).map(([k, v]) => ({
              value: k,
              label: `${v.label} (${v.unit})`,
            }))}
          />
          <button className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-100">
            Show
          </button>
        </form>
        {chart ? (
          <ControlChart {...chart} />
        ) : (
          <EmptyState title="Not enough readings">
            A control chart needs at least two readings of this value for the tank.
          </EmptyState>
        )}
      </section>
    </>
  );
}
