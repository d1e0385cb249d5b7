import "server-only";
import { asc, count, eq, inArray, sql } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { NC_STATUSES, type Outcome, type TestType } from "@/db/enums";
import { cleaningSystems, recipeParameters, testRunLabDetails, testSamples } from "@/db/schema";
import type { LimitState } from "@/lib/bath/limits";
import { emergencyApprovalState } from "@/lib/changes/emergency";
import { dueState, requalificationDue } from "@/lib/changes/periodic";
import { CHANGE_STATUS_LABELS, OPEN_STATUSES, type ChangeStatus } from "@/lib/changes/workflow";
import { deviationState } from "@/lib/deviations/rules";
import { computeRunOutcome } from "@/lib/evidence/outcome";
import { MAINTENANCE_LABELS } from "@/lib/evidence/maintenance";
import { todayUtc } from "@/lib/format/date";
import { keyResult, lastOfEachType, trendOf, type ResultPoint } from "@/lib/overview/key-result";
import { countOverdue, type OverdueTest } from "@/lib/overview/overdue";
import { washerState, type DueState, type WasherState } from "@/lib/overview/state";
import { NC_STATUS_LABELS, type NcStatus } from "@/lib/nonconformances/lifecycle";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";
import { listMaintenance, type MaintenanceItem } from "@/lib/server/bath/queries";
import { lotsUsedOf } from "@/lib/server/deviations/state";
import { loadCombinations, type OverviewCombination } from "./combinations";
import { listOverdueTests } from "./overdue-tests";

/** Washers per page: each carries its tanks, part families and trends, so the page stays bounded. */
export const WASHERS_PER_PAGE = 6;
/** Verified runs read per washer × part family: enough for a trend at a glance, bounded at plant scale. */
export const RUNS_PER_COMBINATION = 10;
/** Open records listed by name per washer; the rest are counted and linked. */
export const OPEN_ITEMS_PER_WASHER = 5;

/** A bound list for `in (…)` in raw SQL. */
const inList = (values: readonly string[]) =>
  sql`(${sql.join(
    values.map((v) => sql`${v}`),
    sql`, `,
  )})`;

const OPEN_NC: NcStatus[] = NC_STATUSES.filter((s) => s !== "closed" && s !== "cancelled");

interface RunRow {
  id: string;
  number: string;
  revision: number;
  part_family_id: string;
  recipe_version_id: string;
  system_id: string;
  test_type: TestType;
  outcome: Outcome | null;
  performed_on: string;
  run_data: string | null;
}

/**
 * The newest verified runs of each washer × part family, in one statement: one indexed, limited
 * read per pair (test_runs_family_status_idx walks a family's verified runs newest first and stops
 * after the limit), joined by UNION ALL so the page makes one round trip, not one per pair.
 */
export function latestRunsQuery(pairs: { systemId: string; familyId: string }[], limit: number) {
  const parts = pairs.map(
    (p) => sql`select * from (
      select r.id, r.number, r.revision, r.part_family_id, r.recipe_version_id, ${p.systemId} as system_id,
        r.test_type, r.outcome, r.performed_on, r.run_data
      from test_runs r indexed by test_runs_family_status_idx
      where r.part_family_id = ${p.familyId} and r.status = 'verified' and r.performed_on is not null
        and r.recipe_version_id in (select v.id from recipe_versions v join recipes rc on rc.id = v.recipe_id where rc.system_id = ${p.systemId})
      order by r.performed_on desc, r.number desc
      limit ${limit})`,
  );
  return sql.join(parts, sql` union all `);
}

export interface OverviewResult extends ResultPoint {
  /** The run's cleanliness code (particle tests), computed from its samples as the run page does. */
  code: string | null;
}

export interface OverviewFamilyRow {
  familyId: string;
  familyCode: string;
  familyName: string;
  specCode: string;
  combinations: {
    recipeId: string;
    recipeCode: string;
    version: number;
    requalificationDue: string;
    requalificationState: DueState;
  }[];
  /** The newest verified result of each test type. */
  last: OverviewResult[];
  trend: ReturnType<typeof trendOf>;
}

export interface OpenItem {
  kind: "change" | "nonconformance" | "deviation";
  id: string;
  number: string;
  title: string;
  /** The record's status in words. */
  status: string;
  href: string;
  /** Emergency changes: awaiting, or past, their approval date. */
  emergency?: "awaiting" | "overdue";
}

export interface OverviewWasher {
  id: string;
  code: string;
  name: string;
  state: WasherState;
  tanks: {
    stageId: string;
    name: string;
    state: LimitState | null;
    findings: string | null;
    at: string | null;
  }[];
  checks: MaintenanceItem[];
  families: OverviewFamilyRow[];
  open: { items: OpenItem[]; counts: Record<OpenItem["kind"], number> };
}

export interface PlantOverview {
  washers: OverviewWasher[];
  page: number;
  pages: number;
  totalWashers: number;
  summary: {
    openChanges: number;
    emergencyChanges: number;
    overdueEmergencies: number;
    openNonconformances: number;
    activeDeviations: number;
    overdue: Record<OverdueTest["state"], number>;
  };
  overdue: OverdueTest[];
  /** Records open with no washer to file them under (a nonconformance reported by hand). */
  plantWide: OpenItem[];
}

async function openChanges(db: Executor, today: string) {
  const rows = await db.all<{
    id: string;
    number: string;
    title: string;
    status: ChangeStatus;
    system_id: string;
    approval_due_on: string | null;
  }>(sql`select cr.id, cr.number, cr.title, cr.status, rc.system_id, em.approval_due_on
    from change_requests cr indexed by change_requests_status_idx
    join recipes rc on rc.id = cr.recipe_id
    left join emergency_changes em on em.change_request_id = cr.id
    where cr.status in ${inList(OPEN_STATUSES)}
    order by cr.number`);
  return rows.map((r) => {
    const emergency =
      r.approval_due_on === null
        ? undefined
        : emergencyApprovalState({ status: r.status, approvalDueOn: r.approval_due_on, today });
    return {
      systemId: r.system_id,
      item: {
        kind: "change" as const,
        id: r.id,
        number: r.number,
        title: r.title,
        status: CHANGE_STATUS_LABELS[r.status],
        href: `/changes/${r.id}`,
        emergency: emergency === "awaiting" || emergency === "overdue" ? emergency : undefined,
      },
    };
  });
}

async function openNonconformances(db: Executor) {
  // The washer comes from the recipe, else from the reading's tank or the cycle that raised it.
  const rows = await db.all<{
    id: string;
    number: string;
    title: string;
    status: NcStatus;
    system_id: string | null;
  }>(sql`select nc.id, nc.number, nc.title, nc.status,
      coalesce(rc.system_id, st.system_id, wc.system_id) as system_id
    from nonconformances nc indexed by nonconformances_status_idx
    left join recipes rc on rc.id = nc.recipe_id
    left join bath_records br on nc.source_kind = 'bath_reading' and br.id = nc.source_id
    left join system_stages st on st.id = br.stage_id
    left join wash_cycles wc on nc.source_kind = 'cycle' and wc.id = nc.source_id
    where nc.status in ${inList(OPEN_NC)}
    order by nc.number`);
  return rows.map((r) => ({
    systemId: r.system_id,
    item: {
      kind: "nonconformance" as const,
      id: r.id,
      number: r.number,
      title: r.title,
      status: NC_STATUS_LABELS[r.status],
      href: `/nonconformances/${r.id}`,
    },
  }));
}

async function activeDeviations(db: Executor, today: string) {
  const rows = await db.all<{
    id: string;
    number: string;
    title: string;
    status: "approved";
    ends_on: string | null;
    max_lots: number | null;
    system_id: string;
  }>(sql`select d.id, d.number, d.title, d.status, d.ends_on, d.max_lots, rc.system_id
    from deviations d indexed by deviations_status_idx
    join recipes rc on rc.id = d.recipe_id
    where d.status = 'approved' order by d.number`);
  const lots = await lotsUsedOf(
    db,
    rows.map((r) => r.id),
  );
  return rows
    .filter(
      (r) =>
        deviationState(
          { status: r.status, endsOn: r.ends_on, maxLots: r.max_lots },
          today,
          lots.get(r.id) ?? 0,
        ) === "active",
    )
    .map((r) => ({
      systemId: r.system_id,
      item: {
        kind: "deviation" as const,
        id: r.id,
        number: r.number,
        title: r.title,
        status: "Active",
        href: `/deviations/${r.id}`,
      },
    }));
}

/** Each tank's latest graded reading: one correlated, indexed look-back per tank (bath_records_stage_idx). */
async function tankStates(db: Executor, systemIds: string[]) {
  if (systemIds.length === 0) return [];
  return db.all<{
    stage_id: string;
    system_id: string;
    name: string;
    position: number;
    graded: string | null;
  }>(sql`select s.id as stage_id, s.system_id, s.name, s.position,
      (select json_object('state', b.limit_state, 'findings', b.limit_findings, 'at', b.performed_at)
         from bath_records b where b.stage_id = s.id and b.limit_state is not null
         order by b.performed_at desc limit 1) as graded
    from system_stages s
    where s.tank_volume_l is not null and s.system_id in ${inList(systemIds)}
    order by s.system_id, s.position`);
}

async function resultsOf(db: Executor, pairs: OverviewCombination[]) {
  const unique = [...new Map(pairs.map((p) => [`${p.systemId}|${p.familyId}`, p])).values()];
  if (unique.length === 0) return [];
  const runs = await db.all<RunRow>(
    latestRunsQuery(
      unique.map((p) => ({ systemId: p.systemId, familyId: p.familyId })),
      RUNS_PER_COMBINATION,
    ),
  );
  const runIds = runs.map((r) => r.id);
  const versionIds = [...new Set(runs.map((r) => r.recipe_version_id))];
  const [samples, labs, limits] = runIds.length
    ? await Promise.all([
        db
          .select({
            runId: testSamples.runId,
            sampleLabel: testSamples.sampleLabel,
            worstCase: testSamples.worstCase,
            data: testSamples.data,
          })
          .from(testSamples)
          .where(inArray(testSamples.runId, runIds)),
        db
          .select({ runId: testRunLabDetails.runId, details: testRunLabDetails.details })
          .from(testRunLabDetails)
          .where(inArray(testRunLabDetails.runId, runIds)),
        db
          .select({ versionId: recipeParameters.versionId, setpoint: recipeParameters.setpoint })
          .from(recipeParameters)
          .where(
            sql`${inArray(recipeParameters.versionId, versionIds)} and ${recipeParameters.kind} = 'conductivity_limit'`,
          ),
      ])
    : [[], [], []];
  const samplesOf = new Map<string, typeof samples>();
  for (const s of samples) {
    const list = samplesOf.get(s.runId);
    if (list) list.push(s);
    else samplesOf.set(s.runId, [s]);
  }
  const labOf = new Map(labs.map((l) => [l.runId, l.details as LabShape]));
  const limitOf = new Map(limits.map((l) => [l.versionId, l.setpoint]));
  const familyOf = new Map(pairs.map((p) => [p.familyId, p]));
  return runs.map((r) => {
    const combo = familyOf.get(r.part_family_id)!;
    const lab = labOf.get(r.id);
    const family = lab?.component?.wettedAreaCm2
      ? { ...combo.family, wettedAreaCm2: lab.component.wettedAreaCm2 }
      : combo.family;
    const rows = samplesOf.get(r.id) ?? [];
    const input = {
      testType: r.test_type,
      family,
      spec: combo.spec,
      conductivityLimitUsPerCm: limitOf.get(r.recipe_version_id) ?? null,
      samples: rows,
    };
    const code =
      r.test_type === "particle_cleanliness"
        ? computeRunOutcome({
            ...input,
            runData: r.run_data ? JSON.parse(r.run_data) : null,
            lowerSizeLimitUm: lab?.analysis?.lowerSizeLimitUm ?? null,
            photoCount: 0,
          }).code
        : null;
    return {
      systemId: r.system_id,
      familyId: r.part_family_id,
      result: {
        runId: r.id,
        run: `${r.number}${r.revision > 1 ? ` rev ${r.revision}` : ""}`,
        at: r.performed_on,
        testType: r.test_type,
        outcome: r.outcome,
        key: keyResult(input),
        code,
      } satisfies OverviewResult,
    };
  });
}

type LabShape = {
  component?: { wettedAreaCm2?: number };
  analysis?: { lowerSizeLimitUm?: number };
} | null;

/**
 * The plant overview, one page of washers: a fixed number of statements whatever the plant's size
 * (systems, combinations, tanks, maintenance, the runs of the page's washers with their samples,
 * open changes, nonconformances and deviations), each on an index.
 */
export async function loadPlantOverview(
  opts: { page?: number; now?: Date } = {},
): Promise<PlantOverview> {
  const db = getDb();
  const now = opts.now ?? new Date();
  const today = todayUtc(now);
  const [[{ n: totalWashers }], combinations, maintenance, changes, ncs, devs] = await Promise.all([
    db.select({ n: count() }).from(cleaningSystems).where(eq(cleaningSystems.active, true)),
    loadCombinations(db),
    listMaintenance(now),
    openChanges(db, today),
    openNonconformances(db),
    activeDeviations(db, today),
  ]);
  const pages = Math.max(1, Math.ceil(totalWashers / WASHERS_PER_PAGE));
  const page = Math.min(Math.max(1, Math.trunc(opts.page ?? 1) || 1), pages);
  const systems = await db
    .select({ id: cleaningSystems.id, code: cleaningSystems.code, name: cleaningSystems.name })
    .from(cleaningSystems)
    .where(eq(cleaningSystems.active, true))
    .orderBy(asc(cleaningSystems.code))
    .limit(WASHERS_PER_PAGE)
    .offset((page - 1) * WASHERS_PER_PAGE);
  const ids = systems.map((s) => s.id);
  const onPage = combinations.filter((c) => ids.includes(c.systemId));
  const [tanks, results, overdue] = await Promise.all([
    tankStates(db, ids),
    resultsOf(db, onPage),
    listOverdueTests(db, now, { maintenance, combinations }),
  ]);

  const washers = systems.map((s): OverviewWasher => {
    const familyRows = new Map<string, OverviewFamilyRow>();
    for (const c of onPage.filter((c) => c.systemId === s.id)) {
      const due = requalificationDue(c.lastQualifiedAt, c.intervalMonths);
      const row = familyRows.get(c.familyId) ?? {
        familyId: c.familyId,
        familyCode: c.familyCode,
        familyName: c.familyName,
        specCode: `${c.spec.code} rev ${c.spec.revision}`,
        combinations: [],
        last: [],
        trend: null,
      };
      row.combinations.push({
        recipeId: c.recipeId,
        recipeCode: c.recipeCode,
        version: c.version,
        requalificationDue: due,
        requalificationState: dueState(due, now),
      });
      familyRows.set(c.familyId, row);
    }
    for (const row of familyRows.values()) {
      const points = results
        .filter((r) => r.systemId === s.id && r.familyId === row.familyId)
        .map((r) => r.result);
      row.last = lastOfEachType(points) as OverviewResult[];
      row.trend = trendOf(points);
    }
    const families = [...familyRows.values()];
    const tankRows = tanks
      .filter((t) => t.system_id === s.id)
      .map((t) => {
        const g = t.graded
          ? (JSON.parse(t.graded) as { state: LimitState; findings: string | null; at: string })
          : null;
        return {
          stageId: t.stage_id,
          name: t.name,
          state: g?.state ?? null,
          findings: g?.findings ?? null,
          at: g?.at ?? null,
        };
      });
    const checks = maintenance.filter((m) => m.systemId === s.id);
    const mine = <T extends { systemId: string | null; item: OpenItem }>(list: T[]) =>
      list.filter((x) => x.systemId === s.id).map((x) => x.item);
    const openChangesHere = mine(changes);
    const ncsHere = mine(ncs);
    const devsHere = mine(devs);
    const state = washerState({
      tanks: tankRows.map((t) => ({ name: t.name, state: t.state })),
      checks: checks.map((m) => ({
        name: `${m.tank} ${MAINTENANCE_LABELS[m.kind].toLowerCase()}`,
        state: m.status.state,
      })),
      lastResults: families.flatMap((f) =>
        f.last.map((r) => ({
          name: `${f.familyCode} ${TEST_TYPE_LABELS[r.testType]}`,
          outcome: r.outcome,
        })),
      ),
      requalifications: families.flatMap((f) =>
        f.combinations.map((c) => ({
          name: `${c.recipeCode} v${c.version} × ${f.familyCode}`,
          state: c.requalificationState,
        })),
      ),
      openNonconformances: ncsHere.length,
      activeDeviations: devsHere.length,
      overdueEmergencies: openChangesHere.filter((c) => c.emergency === "overdue").length,
      awaitingEmergencies: openChangesHere.filter((c) => c.emergency === "awaiting").length,
    });
    const take = (list: OpenItem[]) => list.slice(0, OPEN_ITEMS_PER_WASHER);
    return {
      ...s,
      state,
      tanks: tankRows,
      checks,
      families,
      open: {
        items: [
          // Emergency changes first: they are in force without approval.
          ...take(
            [...openChangesHere].sort((a, b) => Number(!!b.emergency) - Number(!!a.emergency)),
          ),
          ...take(ncsHere),
          ...take(devsHere),
        ],
        counts: {
          change: openChangesHere.length,
          nonconformance: ncsHere.length,
          deviation: devsHere.length,
        },
      },
    };
  });

  return {
    washers,
    page,
    pages,
    totalWashers,
    summary: {
      openChanges: changes.length,
      emergencyChanges: changes.filter((c) => c.item.emergency).length,
      overdueEmergencies: changes.filter((c) => c.item.emergency === "overdue").length,
      openNonconformances: ncs.length,
      activeDeviations: devs.length,
      overdue: countOverdue(overdue),
    },
    overdue,
    plantWide: ncs.filter((n) => n.systemId === null).map((n) => n.item),
  };
}
