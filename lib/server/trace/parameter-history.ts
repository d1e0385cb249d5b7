import "server-only";
import { loadEmergencies } from "@/lib/server/changes/emergencies";
import { showsEmergency } from "@/lib/changes/emergency";
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import {
  auditEvents,
  changeRequests,
  cleaningSystems,
  partFamilies,
  recipeParameters,
  requalificationIntervals,
  recipes,
  recipeStages,
  recipeVersions,
  users,
} from "@/db/schema";
import { narrativeText } from "@/lib/changes/content";
import { buildParameterTimeline, type VersionValue } from "@/lib/trace/timeline";
import {
  matchParameters,
  MATCH_LIMIT,
  type ParameterFilter,
  type TraceScopes,
} from "@/lib/trace/parameter-search";
import { signatureValidity } from "@/lib/signatures/rules";
import { loadChangeStates } from "@/lib/server/changes/state";
import { changeEvidenceOf, changeSignaturesOf } from "./evidence-of-change";

const EXCERPT = 320;

/** The justification's opening words, so the timeline answers "why" without opening the change. */
export function excerpt(text: string, max = EXCERPT) {
  const flat = text.replace(/\s+/g, " ").trim();
  if (flat.length <= max) return flat;
  const cut = flat.slice(0, max);
  return `${cut.slice(0, Math.max(cut.lastIndexOf(" "), max - 20))} …`;
}

/** Where the trace search looks: one recipe, one cleaning system's recipes, or the whole plant. */
export interface TraceScope {
  systemId?: string;
  recipeId?: string;
}

/**
 * Every parameter that can be traced, one row per recipe and key, for the search; within a scope
 * when one is given (a recipe's own rows come through its versions' index, never the whole plant).
 */
export async function listTraceableParameters(scope: TraceScope = {}) {
  const db = getDb();
  // One row per recipe and key, grouped in SQLite: with a single max() the bare
  // columns come from the row holding the maximum (SQLite, "bare columns in an
  // aggregate query"), so the latest version's name and
  // stage win; the key is what stays the same.
  const rows = await db
    .select({
      key: recipeParameters.key,
      name: recipeParameters.name,
      unit: recipeParameters.unit,
      stage: recipeStages.name,
      // Bare columns of the latest version's row (as name and stage above): its place in the process.
      stagePosition: recipeStages.position,
      order: sql<number>`${recipeParameters}.rowid`,
      latest: sql<number>`max(${recipeVersions.version})`,
      versions: sql<number>`count(*)`,
      recipeId: recipes.id,
      recipeCode: recipes.code,
      recipeName: recipes.name,
      systemId: cleaningSystems.id,
      systemCode: cleaningSystems.code,
      systemName: cleaningSystems.name,
    })
    .from(recipeParameters)
    .innerJoin(recipeStages, eq(recipeStages.id, recipeParameters.stageId))
    .innerJoin(recipeVersions, eq(recipeVersions.id, recipeParameters.versionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .where(
      and(
        scope.recipeId ? eq(recipeVersions.recipeId, scope.recipeId) : undefined,
        scope.systemId ? eq(recipes.systemId, scope.systemId) : undefined,
      ),
    )
    .groupBy(recipes.id, recipeParameters.key);
  // Parameters of a recipe in process order (wash before drying), as everywhere else.
  return rows
    .sort(
      (a, b) =>
        a.systemCode.localeCompare(b.systemCode) ||
        a.recipeCode.localeCompare(b.recipeCode) ||
        a.stagePosition - b.stagePosition ||
        a.order - b.order,
    )
    .map(({ latest: _l, order: _o, stagePosition: _p, ...r }) => r);
}
export type TraceableParameter = Awaited<ReturnType<typeof listTraceableParameters>>[number];

/**
 * The trace search's answer: the first MATCH_LIMIT matches in list order and how many in all.
 * With no system, recipe or words (the page as it opens) every parameter of the plant matches:
 * tens of thousands at plant size. They are then counted in SQL, and only the first systems'
 * parameters are read, system by system in list order, until the first MATCH_LIMIT are found.
 */
export async function searchTraceableParameters(filter: ParameterFilter) {
  const { systemId, recipeId, q } = filter;
  if (systemId || recipeId || (q ?? "").trim() !== "")
    return matchParameters(await listTraceableParameters({ systemId, recipeId }), filter);
  const db = getDb();
  const [counted] = await db.all<{ total: number }>(sql`
    select count(*) as total from (
      select 1 from ${recipeParameters}
      join ${recipeStages} on ${recipeStages.id} = ${recipeParameters.stageId}
      join ${recipeVersions} on ${recipeVersions.id} = ${recipeParameters.versionId}
      join ${recipes} on ${recipes.id} = ${recipeVersions.recipeId}
      join ${cleaningSystems} on ${cleaningSystems.id} = ${recipes.systemId}
      group by ${recipes.id}, ${recipeParameters.key})`);
  const systems = (
    await db.select({ id: cleaningSystems.id, code: cleaningSystems.code }).from(cleaningSystems)
  ).sort((a, b) => a.code.localeCompare(b.code));
  const items: TraceableParameter[] = [];
  for (const system of systems) {
    if (items.length >= MATCH_LIMIT) break;
    items.push(...(await listTraceableParameters({ systemId: system.id })));
  }
  return { total: Number(counted?.total ?? 0), items: items.slice(0, MATCH_LIMIT) };
}

/**
 * The cleaning systems the trace search offers, and the recipes of one of them, without reading any
 * parameter: the two choosers need names only, and every recipe holds parameters from its first
 * version. A plant's hundreds of recipes are read for the chosen system alone (none before one is
 * chosen); the recipe chooser asks for another system's as it is chosen.
 */
export async function listTraceScopes(systemId?: string): Promise<TraceScopes> {
  const db = getDb();
  const hasVersions = sql`exists (select 1 from ${recipeVersions} where ${recipeVersions.recipeId} = ${recipes.id})`;
  const [systems, systemRecipes] = await Promise.all([
    db
      .select({ id: cleaningSystems.id, code: cleaningSystems.code, name: cleaningSystems.name })
      .from(cleaningSystems)
      .where(
        sql`exists (select 1 from ${recipes} where ${recipes.systemId} = ${cleaningSystems.id} and ${hasVersions})`,
      )
      .orderBy(asc(cleaningSystems.code)),
    systemId
      ? db
          .select({ id: recipes.id, code: recipes.code, name: recipes.name })
          .from(recipes)
          .where(and(eq(recipes.systemId, systemId), hasVersions))
          .orderBy(asc(recipes.code))
      : [],
  ]);
  return {
    systems: systems.map((x) => ({ id: x.id, label: `${x.code} · ${x.name}` })),
    recipes: systemRecipes.map((r) => ({
      id: r.id,
      label: `${r.code} · ${r.name}`,
      systemId: systemId!,
    })),
  };
}

/**
 * The whole history of one recipe parameter: each value and validated range it has
 * had, when it was in force, and for each change the request with its justification,
 * impact, signatures and the evidence that requalified it.
 *
 * With `newest`, only the newest that many entries are read in full (a busy parameter has
 * dozens); `older` then says how many came before them and the value in force before the
 * first one shown, so the page can still show "from → to" and offer the rest.
 */
export async function getParameterHistory(
  input: { recipeId: string; key: string },
  options: { newest?: number } = {},
) {
  const db = getDb();
  // Every committed write appends an audit event in its own transaction, so the chain's newest hash
  // names the state of the data: a history read under the same head is the same history. It is read
  // first, so a write landing during the read can only leave a newer history under an older head,
  // which the next request reads again.
  const chainHead = await auditChainHead(db);
  const cacheKey = `${input.recipeId}|${input.key}|${options.newest ?? "all"}`;
  const perDb = historyCache.get(db) ?? new Map<string, CachedHistory>();
  historyCache.set(db, perDb);
  const hit = perDb.get(cacheKey);
  if (hit && hit.chainHead === chainHead) {
    perDb.delete(cacheKey);
    perDb.set(cacheKey, hit); // most recently used last
    return hit.history;
  }
  const history = await readParameterHistory(db, input, options);
  perDb.set(cacheKey, { chainHead, history });
  if (perDb.size > HISTORY_CACHE_SIZE) perDb.delete(perDb.keys().next().value!);
  return history;
}

type History = Awaited<ReturnType<typeof readParameterHistory>>;
interface CachedHistory {
  chainHead: string | null;
  history: History;
}
/** Histories recently read, per database, each under the audit chain head it was read at. */
const historyCache = new WeakMap<object, Map<string, CachedHistory>>();
const HISTORY_CACHE_SIZE = 64;

/** Drops the remembered histories, so the next read is a cold one (the benchmark measures both). */
export function forgetParameterHistories() {
  historyCache.delete(getDb());
}

async function auditChainHead(db: Executor): Promise<string | null> {
  const [row] = await db
    .select({ hash: auditEvents.hash })
    .from(auditEvents)
    .orderBy(desc(auditEvents.seq))
    .limit(1);
  return row?.hash ?? null;
}

async function readParameterHistory(
  db: ReturnType<typeof getDb>,
  input: { recipeId: string; key: string },
  options: { newest?: number },
) {
  const [head] = await db
    .select({ recipe: recipes, system: cleaningSystems })
    .from(recipes)
    .innerJoin(cleaningSystems, eq(cleaningSystems.id, recipes.systemId))
    .where(eq(recipes.id, input.recipeId));
  if (!head) return undefined;
  const versions = await db
    .select({ v: recipeVersions, author: users.name })
    .from(recipeVersions)
    .leftJoin(users, eq(users.id, recipeVersions.createdBy))
    .where(eq(recipeVersions.recipeId, input.recipeId))
    .orderBy(asc(recipeVersions.version));
  const ids = versions.map((v) => v.v.id);
  // This parameter's row in each version only (by the (version, key) index), not the whole recipe.
  const mine = ids.length
    ? await db
        .select({ p: recipeParameters, stage: recipeStages.name })
        .from(recipeParameters)
        .innerJoin(recipeStages, eq(recipeStages.id, recipeParameters.stageId))
        .where(and(inArray(recipeParameters.versionId, ids), eq(recipeParameters.key, input.key)))
    : [];
  if (mine.length === 0) return undefined;

  const values: VersionValue[] = versions.map(({ v }) => {
    const row = mine.find((r) => r.p.versionId === v.id);
    return {
      versionId: v.id,
      version: v.version,
      status: v.status,
      effectiveFrom: v.effectiveFrom,
      effectiveTo: v.effectiveTo,
      value: row
        ? {
            name: row.p.name,
            stage: row.stage,
            setpoint: row.p.setpoint,
            unit: row.p.unit,
            validatedLow: row.p.validatedLow,
            validatedHigh: row.p.validatedHigh,
            critical: row.p.critical,
          }
        : null,
    };
  });
  // Only what the timeline prints of every change of the recipe: the assessment details (large)
  // are read by loadChangeStates for the changes shown.
  const changes = await db
    .select({
      id: changeRequests.id,
      number: changeRequests.number,
      title: changeRequests.title,
      status: changeRequests.status,
      fromVersionId: changeRequests.fromVersionId,
      toVersionId: changeRequests.toVersionId,
      createdAt: changeRequests.createdAt,
      closedAt: changeRequests.closedAt,
    })
    .from(changeRequests)
    .where(eq(changeRequests.recipeId, input.recipeId));
  const proposedFrom = new Map(
    changes.filter((c) => c.toVersionId).map((c) => [c.toVersionId!, c.fromVersionId]),
  );
  const whole = buildParameterTimeline(values, proposedFrom);
  const hidden = options.newest === undefined ? 0 : Math.max(0, whole.length - options.newest);
  const timeline = whole.slice(hidden);

  // Everything about the changes is read for all of them at once: a statement per change grew with
  // the parameter's history (a busy parameter issued hundreds per view).
  const byVersion = new Map(changes.filter((c) => c.toVersionId).map((c) => [c.toVersionId!, c]));
  const shown = [
    ...new Set(
      timeline
        .map((period) => byVersion.get(period.introducedBy.versionId)?.id)
        .filter((id): id is string => id !== undefined),
    ),
  ];
  const states = await loadChangeStates(db, shown);
  const signaturesOf = await changeSignaturesOf(db, shown);
  const evidenceOf = await changeEvidenceOf(db, shown);
  const emergencies = await loadEmergencies(db, shown);
  const versionById = new Map(versions.map((v) => [v.v.id, v]));
  // A value that came in without a change request was proven by the validation that qualified
  // its version: the qualified combinations name it (basis) and when it was qualified.
  const unchanged = timeline
    .map((p) => p.introducedBy.versionId)
    .filter((versionId) => !byVersion.has(versionId));
  const validationsOf = await versionValidations(db, unchanged);
  const entries = timeline.map((period) => {
    const cr = changes.find((c) => c.toVersionId === period.introducedBy.versionId);
    const version = versionById.get(period.introducedBy.versionId)!;
    if (!cr)
      return {
        period,
        versionNote: version.v.notes,
        versionAuthor: version.author,
        versionCreatedAt: version.v.createdAt,
        validations: validationsOf.get(version.v.id) ?? [],
        change: null,
      };
    const state = states.get(cr.id)!;
    const row = state.assessment.diff.parameters.find((p) => p.key === input.key) ?? null;
    const sigs = signaturesOf.get(cr.id)!;
    const evidence = evidenceOf.get(cr.id)!;
    return {
      period,
      versionNote: version.v.notes,
      versionAuthor: version.author,
      versionCreatedAt: version.v.createdAt,
      change: {
        id: cr.id,
        number: cr.number,
        title: cr.title,
        status: cr.status,
        /** Implemented before approval; the page says "Emergency" until it is closed. */
        emergency: emergencies.has(cr.id) && showsEmergency(cr.status),
        impact: state.impact,
        author: version.author,
        openedAt: cr.createdAt,
        closedAt: cr.closedAt,
        justification: excerpt(narrativeText(state.narrative?.content ?? null)),
        parameterImpact: row
          ? { impact: row.impact, position: row.position, reasons: row.reasons }
          : null,
        requirements: state.requirements.map((r) => ({ testType: r.testType, samples: r.samples })),
        // A signature binds only while the content still hashes to what was signed; reopening starts a new revision.
        signatures: sigs.map((sig) => ({
          ...sig,
          binding:
            sig.revision !== state.assessmentRow.revision
              ? ("earlier_revision" as const)
              : signatureValidity(sig.contentHash, state.contentHash),
        })),
        revision: state.assessmentRow.revision,
        evidence,
      },
    };
  });
  const latest = mine.sort(
    (a, b) =>
      (versions.find((v) => v.v.id === b.p.versionId)?.v.version ?? 0) -
      (versions.find((v) => v.v.id === a.p.versionId)?.v.version ?? 0),
  )[0];
  return {
    system: head.system,
    recipe: head.recipe,
    parameter: {
      key: input.key,
      name: latest.p.name,
      stage: latest.stage,
      unit: latest.p.unit,
      critical: latest.p.critical,
    },
    entries,
    ...(options.newest === undefined
      ? {}
      : {
          older: {
            count: hidden,
            previous: whole.slice(0, hidden).findLast((p) => p.kind === "in_force")?.value,
          },
        }),
  };
}
/** The qualified combinations of these versions, each with the validation that proved it. */
export async function versionValidations(db: ReturnType<typeof getDb>, versionIds: string[]) {
  const rows = versionIds.length
    ? await db
        .select({
          versionId: requalificationIntervals.recipeVersionId,
          partFamilyId: partFamilies.id,
          partFamily: partFamilies.code,
          partFamilyName: partFamilies.name,
          basis: requalificationIntervals.basis,
          qualifiedAt: requalificationIntervals.lastQualifiedAt,
        })
        .from(requalificationIntervals)
        .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
        .where(inArray(requalificationIntervals.recipeVersionId, versionIds))
        .orderBy(asc(partFamilies.code))
    : [];
  const map = new Map<string, Omit<(typeof rows)[number], "versionId">[]>();
  for (const { versionId, ...r } of rows) map.set(versionId, [...(map.get(versionId) ?? []), r]);
  return map;
}

export type ParameterHistory = NonNullable<Awaited<ReturnType<typeof getParameterHistory>>>;
