import { and, desc, eq, gte, inArray, lte, ne } from "drizzle-orm";
import type { Tx } from "@/db/client";
import {
  nonconformanceItems,
  nonconformances,
  partFamilies,
  recipes,
  recipeVersions,
  cleaningSystems,
  testRuns,
  users,
  washCycleLots,
  washCycles,
} from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR, type AuditActor } from "@/lib/audit";
import {
  containmentScope,
  lastPassingTest,
  type ProcessedItem,
} from "@/lib/nonconformances/containment";
import { formatDate } from "@/lib/format/date";
import { nextNcNumber } from "@/lib/nonconformances/numbering";
import { UserFacingError } from "@/lib/server/errors";
import type { NC_MANUAL_KINDS, NC_SEVERITIES, NC_SOURCE_KINDS } from "@/db/enums";

export interface RaiseNonconformanceInput {
  source: { kind: (typeof NC_SOURCE_KINDS)[number]; id: string | null; label: string };
  title: string;
  description: string;
  severity: (typeof NC_SEVERITIES)[number];
  /** ISO date (YYYY-MM-DD). */
  detectedOn: string;
  recipeId?: string | null;
  partFamilyId?: string | null;
  /** Who raised it; null when the system did (a check decided by the scheduler). */
  actorId: string | null;
  /** For a report by hand: customer complaint, field return or audit finding. */
  manualKind?: (typeof NC_MANUAL_KINDS)[number] | null;
  /** Containment the caller found itself (the runs that cited an instrument found out of tolerance). */
  items?: ProcessedItem[];
}

/**
 * Opens a nonconformance inside the caller's transaction (with the step that found the
 * failure), numbers it NC-YYYY-NNN without gaps, lists its containment from the runs processed
 * on the recipe and part family since the last passing verified test, and audits it.
 */
export async function raiseNonconformance(
  tx: Tx,
  input: RaiseNonconformanceInput,
  now = new Date(),
): Promise<{ id: string; number: string }> {
  const [actor]: AuditActor[] =
    input.actorId === null
      ? [SYSTEM_ACTOR]
      : await tx
          .select({ id: users.id, name: users.name })
          .from(users)
          .where(eq(users.id, input.actorId));
  if (!actor)
    throw new UserFacingError("The person raising this is not known.", { kind: "invalid" });
  const recipe = input.recipeId
    ? (await tx.select().from(recipes).where(eq(recipes.id, input.recipeId)))[0]
    : null;
  if (input.recipeId && !recipe)
    throw new UserFacingError("That recipe does not exist.", {
      kind: "invalid",
      field: "recipeId",
    });
  const family = input.partFamilyId
    ? (await tx.select().from(partFamilies).where(eq(partFamilies.id, input.partFamilyId)))[0]
    : null;
  if (input.partFamilyId && !family)
    throw new UserFacingError("That part family does not exist.", {
      kind: "invalid",
      field: "partFamilyId",
    });

  // The year of detection numbers it; the (year, sequence) unique index refuses a duplicate.
  const year = Number(input.detectedOn.split("-")[0]);
  const [last] = await tx
    .select({ sequence: nonconformances.sequence })
    .from(nonconformances)
    .where(eq(nonconformances.year, year))
    .orderBy(desc(nonconformances.sequence))
    .limit(1);
  const { sequence, number } = nextNcNumber(year, last?.sequence ?? null);

  const [nc] = await tx
    .insert(nonconformances)
    .values({
      number,
      year,
      sequence,
      title: input.title,
      description: input.description,
      severity: input.severity,
      sourceKind: input.source.kind,
      sourceId: input.source.id,
      sourceLabel: input.source.label,
      manualKind: input.source.kind === "manual" ? (input.manualKind ?? null) : null,
      detectedOn: input.detectedOn,
      recipeId: recipe?.id ?? null,
      partFamilyId: family?.id ?? null,
      openedBy: actor.id,
      createdAt: now.toISOString(),
    })
    .returning();

  const affected = input.items
    ? input.items
    : recipe && family
      ? await affectedRuns(tx, recipe.id, family.id, {
          until: now.toISOString(),
          failedAt:
            input.source.kind === "run" && input.source.id
              ? await runDate(tx, input.source.id, input.detectedOn)
              : input.detectedOn,
        })
      : [];
  // In slices: a containment of thousands of cycles would pass SQLite's limit on bound values.
  for (const slice of chunk(affected))
    await tx.insert(nonconformanceItems).values(
      slice.map((i) => ({
        nonconformanceId: nc.id,
        itemKind: i.kind,
        itemId: i.id,
        label: i.label,
        lots: i.lots,
        processedAt: i.at,
      })),
    );

  await appendAudit(
    tx,
    actor,
    {
      eventType: "nonconformance.raised",
      recordType: "nonconformance",
      recordId: nc.id,
      new: {
        number,
        title: input.title,
        severity: input.severity,
        source: input.source.kind,
        sourceLabel: input.source.label,
        manualKind: nc.manualKind,
        detectedOn: input.detectedOn,
        recipe: recipe?.code ?? null,
        partFamily: family?.code ?? null,
        affectedItems: affected.map((i) => i.label),
      },
    },
    now,
  );
  return { id: nc.id, number };
}

async function runDate(tx: Tx, runId: string, fallback: string) {
  const [run] = await tx
    .select({ performedOn: testRuns.performedOn, createdAt: testRuns.createdAt })
    .from(testRuns)
    .where(eq(testRuns.id, runId));
  return run?.performedOn ?? run?.createdAt ?? fallback;
}

/**
 * The test runs and wash cycles (with their lots) on any version of the recipe for the part
 * family (superseded run revisions left out), bounded by the last passing verified run at or
 * before the failure.
 */
async function affectedRuns(
  tx: Tx,
  recipeId: string,
  partFamilyId: string,
  opts: { failedAt: string; until: string },
): Promise<ProcessedItem[]> {
  const versionIds = (
    await tx
      .select({ id: recipeVersions.id })
      .from(recipeVersions)
      .where(eq(recipeVersions.recipeId, recipeId))
  ).map((v) => v.id);
  if (versionIds.length === 0) return [];
  const runs = await tx
    .select()
    .from(testRuns)
    .where(
      and(
        eq(testRuns.partFamilyId, partFamilyId),
        inArray(testRuns.recipeVersionId, versionIds),
        ne(testRuns.status, "superseded"),
      ),
    );
  const at = (r: (typeof runs)[number]) => r.performedOn ?? r.createdAt;
  const lastPass = lastPassingTest(
    runs
      .filter((r) => r.status === "verified" && r.outcome)
      .map((r) => ({ id: r.id, at: at(r), outcome: r.outcome! })),
    opts.failedAt,
  );
  const cycles = await cyclesSince(tx, versionIds, partFamilyId, lastPass?.at ?? null, opts.until);
  return containmentScope(
    [
      ...runs.map((r) => ({
        kind: "run" as const,
        id: r.id,
        label: r.revision > 1 ? `${r.number} rev. ${r.revision}` : r.number,
        lots: [],
        at: at(r),
      })),
      ...cycles,
    ],
    lastPass,
    opts.until,
  );
}

/**
 * The wash cycles of the part family on the recipe's versions started in the suspect window, each
 * with its lots. The window is read through the (version, start) index; `containmentScope` applies
 * the exact bounds (a bare date as the start of its day).
 */
async function cyclesSince(
  tx: Tx,
  versionIds: string[],
  partFamilyId: string,
  from: string | null,
  until: string,
): Promise<ProcessedItem[]> {
  const rows = await tx
    .select({
      id: washCycles.id,
      cycleNumber: washCycles.cycleNumber,
      system: cleaningSystems.code,
      startedAt: washCycles.startedAt,
    })
    .from(washCycles)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, washCycles.systemId))
    .where(
      and(
        inArray(washCycles.recipeVersionId, versionIds),
        eq(washCycles.partFamilyId, partFamilyId),
        from ? gte(washCycles.startedAt, formatDate(from)) : undefined,
        lte(washCycles.startedAt, until),
      ),
    );
  if (rows.length === 0) return [];
  const lots = new Map<string, string[]>();
  for (const ids of chunk(rows.map((r) => r.id))) {
    const found = await tx.select().from(washCycleLots).where(inArray(washCycleLots.cycleId, ids));
    for (const l of found) lots.set(l.cycleId, [...(lots.get(l.cycleId) ?? []), l.lotNumber]);
  }
  return rows.map((r) => ({
    kind: "cycle" as const,
    id: r.id,
    label: cycleLabel(r.system, r.cycleNumber),
    lots: (lots.get(r.id) ?? []).toSorted(),
    at: r.startedAt,
  }));
}

/** How a nonconformance names a wash cycle: the washer and the washer's own cycle id. */
export function cycleLabel(system: string, cycleNumber: string) {
  return `${system} cycle ${cycleNumber}`;
}

// SQLite caps bound parameters per statement; lots are read in slices.
const chunk = <T>(xs: T[], n = 500) =>
  Array.from({ length: Math.ceil(xs.length / n) }, (_, i) => xs.slice(i * n, i * n + n));
