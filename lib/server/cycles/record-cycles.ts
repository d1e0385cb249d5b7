// Not "server-only": the demo seed and the benchmark record cycles under tsx.
import { and, eq, inArray } from "drizzle-orm";
import type { Tx } from "@/db/client";
import {
  cleaningSystems,
  partFamilies,
  recipeParameters,
  recipes,
  recipeVersions,
  requalificationIntervals,
  washCycleLots,
  washCycles,
  type CycleSource,
} from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { cycleFlags, type CycleParameter } from "@/lib/cycles/flag";
import { inForceAt } from "@/lib/cycles/in-force";
import { formatDateTime } from "@/lib/format/date";
import type { CycleInput } from "@/lib/schemas/cycle";
import { UserFacingError } from "@/lib/server/errors";
import { recordCycleFlags, type FlaggedCycle } from "./flag-cycles";

/** A refusal of one cycle in a recording: its position in the batch, the field and why. */
export interface CycleProblem {
  index: number;
  field: string;
  message: string;
}

/** Refuses a whole recording: every problem found (up to 50 kept), each naming its cycle and field. */
export class CycleRecordingError extends UserFacingError {
  readonly problems: CycleProblem[];
  readonly problemCount: number;
  constructor(problems: CycleProblem[], problemCount: number, single: boolean) {
    const first = problems[0];
    super(
      single
        ? first.message
        : `${problemCount} problem(s) in ${new Set(problems.map((p) => p.index)).size}+ cycle(s). Nothing was recorded.`,
      {
        kind: "invalid",
        field: single ? first.field : undefined,
        // A batch names each problem by its place: cycles.<n>.<field>, as the API body has it.
        fieldErrors: single ? undefined : batchFieldErrors(problems),
      },
    );
    this.problems = problems;
    this.problemCount = problemCount;
  }
}

function batchFieldErrors(problems: CycleProblem[]) {
  const out: Record<string, string[]> = {};
  for (const p of problems) (out[`cycles.${p.index}.${p.field}`] ??= []).push(p.message);
  return out;
}

const CHUNK = 400;
const MAX_PROBLEMS = 50;
const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));
const chunks = <T>(xs: T[], n = CHUNK) =>
  Array.from({ length: Math.ceil(xs.length / n) }, (_, i) => xs.slice(i * n, i * n + n));

export interface RecordCycles {
  source: CycleSource;
  cycles: CycleInput[];
  /** The washer's log file, for a CSV import. */
  file?: { name: string; sha256: string };
}

/**
 * Records wash cycles — from the form, a washer's log or a machine feed — all or none. Each cycle is
 * checked against the plant: the washer and its recipe, the version in force at the cycle's start,
 * the part family qualified on that version, a cycle id new on its washer. Values outside their
 * validated range flag the cycle (`recordCycleFlags`). Rows are written in batches, with the event
 * loop turning between them, so a 100,000-cycle log does not stall other requests.
 */
export async function recordCyclesIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  input: RecordCycles,
  now = new Date(),
) {
  const { cycles } = input;
  if (cycles.length === 0)
    throw new UserFacingError("There are no cycles to record.", { kind: "invalid" });
  const problems: CycleProblem[] = [];
  let problemCount = 0;
  const fail = (index: number, field: string, message: string) => {
    problemCount += 1;
    if (problems.length < MAX_PROBLEMS) problems.push({ index, field, message });
  };

  const uniq = <T>(xs: T[]) => [...new Set(xs)];
  const systemRows = await tx
    .select({ id: cleaningSystems.id, code: cleaningSystems.code, active: cleaningSystems.active })
    .from(cleaningSystems)
    .where(inArray(cleaningSystems.code, uniq(cycles.map((c) => c.system))));
  const systemByCode = new Map(systemRows.map((s) => [s.code, s]));
  const recipeRows = await tx
    .select({ id: recipes.id, code: recipes.code, systemId: recipes.systemId })
    .from(recipes)
    .where(inArray(recipes.code, uniq(cycles.map((c) => c.recipe))));
  const recipeByCode = new Map(recipeRows.map((r) => [r.code, r]));
  const versionRows = recipeRows.length
    ? await tx
        .select()
        .from(recipeVersions)
        .where(
          inArray(
            recipeVersions.recipeId,
            recipeRows.map((r) => r.id),
          ),
        )
    : [];
  const familyRows = await tx
    .select({ id: partFamilies.id, code: partFamilies.code })
    .from(partFamilies)
    .where(inArray(partFamilies.code, uniq(cycles.map((c) => c.partFamily))));
  const familyByCode = new Map(familyRows.map((f) => [f.code, f]));
  const qualified = new Set(
    versionRows.length && familyRows.length
      ? (
          await tx
            .select({
              v: requalificationIntervals.recipeVersionId,
              f: requalificationIntervals.partFamilyId,
            })
            .from(requalificationIntervals)
            .where(
              and(
                inArray(
                  requalificationIntervals.recipeVersionId,
                  versionRows.map((v) => v.id),
                ),
                inArray(
                  requalificationIntervals.partFamilyId,
                  familyRows.map((f) => f.id),
                ),
              ),
            )
        ).map((q) => `${q.v}|${q.f}`)
      : [],
  );
  const parameterRows = versionRows.length
    ? await tx
        .select()
        .from(recipeParameters)
        .where(
          inArray(
            recipeParameters.versionId,
            versionRows.map((v) => v.id),
          ),
        )
    : [];
  const versionsOf = new Map<string, typeof versionRows>();
  for (const v of versionRows)
    versionsOf.set(v.recipeId, [...(versionsOf.get(v.recipeId) ?? []), v]);
  const keysOf = new Map<string, Set<string>>();
  for (const p of parameterRows)
    keysOf.set(p.versionId, (keysOf.get(p.versionId) ?? new Set()).add(p.key));
  const parametersOf = new Map<string, CycleParameter[]>();
  for (const p of parameterRows) {
    const list = parametersOf.get(p.versionId) ?? [];
    list.push(p);
    parametersOf.set(p.versionId, list);
  }

  // Each cycle's facts, or its refusals.
  type Checked = {
    input: CycleInput;
    systemId: string;
    versionId: string;
    familyId: string;
    recipeId: string;
    reasons: string[];
  };
  const checked: (Checked | null)[] = [];
  const seen = new Set<string>();
  for (const [i, c] of cycles.entries()) {
    const before = problemCount;
    const system = systemByCode.get(c.system);
    if (!system) fail(i, "system", `There is no washer ${c.system}: use a cleaning system's code.`);
    else if (!system.active) fail(i, "system", `Washer ${c.system} is retired.`);
    const recipe = recipeByCode.get(c.recipe);
    if (!recipe) fail(i, "recipe", `There is no recipe ${c.recipe}.`);
    else if (system && recipe.systemId !== system.id)
      fail(i, "recipe", `${c.recipe} is not a recipe of washer ${c.system}.`);
    const family = familyByCode.get(c.partFamily);
    if (!family) fail(i, "partFamily", `There is no part family ${c.partFamily}.`);
    if (Date.parse(c.endedAt) < Date.parse(c.startedAt))
      fail(i, "endedAt", "The end is before the start.");
    let version: (typeof versionRows)[number] | undefined;
    if (recipe) {
      const versions = versionsOf.get(recipe.id) ?? [];
      const inForce = versions.find((v) => inForceAt(v, c.startedAt));
      // Formatted only for a refusal: 100,000 cycles would otherwise format 100,000 dates for nothing.
      const at = () => formatDateTime(c.startedAt);
      if (c.version !== undefined) {
        version = versions.find((v) => v.version === c.version);
        if (!version) fail(i, "version", `${c.recipe} has no version ${c.version}.`);
        else if (!inForceAt(version, c.startedAt)) {
          fail(
            i,
            "version",
            `${c.recipe} v${c.version} was not in force at the cycle's start (${at()}): ${inForce ? `v${inForce.version} was` : "no version was"}.`,
          );
          version = undefined;
        }
      } else {
        version = inForce;
        if (!version) fail(i, "version", `No version of ${c.recipe} was in force at ${at()}.`);
      }
    }
    if (version && family && !qualified.has(`${version.id}|${family.id}`))
      fail(
        i,
        "partFamily",
        `${c.partFamily} is not qualified on ${c.recipe} v${version.version}: a cycle is recorded only on a qualified combination.`,
      );
    const params = version ? (parametersOf.get(version.id) ?? []) : [];
    if (version)
      for (const key of Object.keys(c.values))
        if (!keysOf.get(version.id)?.has(key))
          fail(i, `values.${key}`, `${c.recipe} v${version.version} has no parameter ${key}.`);
    if (system) {
      const key = `${system.id}|${c.cycleNumber}`;
      if (seen.has(key))
        fail(i, "cycleNumber", `Cycle ${c.cycleNumber} on ${c.system} appears twice.`);
      seen.add(key);
    }
    checked.push(
      problemCount === before && system && version && family && recipe
        ? {
            input: c,
            systemId: system.id,
            versionId: version.id,
            familyId: family.id,
            recipeId: recipe.id,
            reasons: cycleFlags(params, c.values),
          }
        : null,
    );
  }
  // Cycle ids already on the washer.
  const bySystem = new Map<string, { number: string; index: number }[]>();
  for (const [i, c] of checked.entries())
    if (c) {
      const list = bySystem.get(c.systemId) ?? [];
      list.push({ number: c.input.cycleNumber, index: i });
      bySystem.set(c.systemId, list);
    }
  for (const [systemId, list] of bySystem)
    for (const part of chunks(list)) {
      const taken = await tx
        .select({ n: washCycles.cycleNumber })
        .from(washCycles)
        .where(
          and(
            eq(washCycles.systemId, systemId),
            inArray(
              washCycles.cycleNumber,
              part.map((p) => p.number),
            ),
          ),
        );
      const takenSet = new Set(taken.map((t) => t.n));
      for (const p of part)
        if (takenSet.has(p.number))
          fail(
            p.index,
            "cycleNumber",
            `Cycle ${p.number} is already recorded on ${cycles[p.index].system}.`,
          );
    }
  if (problemCount > 0)
    throw new CycleRecordingError(
      problems.sort((a, b) => a.index - b.index),
      problemCount,
      cycles.length === 1,
    );

  const batchId = crypto.randomUUID();
  const recordedAt = now.toISOString();
  const rows = (checked as Checked[]).map((c) => ({
    id: crypto.randomUUID(),
    systemId: c.systemId,
    cycleNumber: c.input.cycleNumber,
    recipeVersionId: c.versionId,
    partFamilyId: c.familyId,
    baskets: c.input.baskets,
    startedAt: c.input.startedAt,
    endedAt: c.input.endedAt,
    operator: c.input.operator,
    actualValues: c.input.values,
    flagged: c.reasons.length > 0,
    flagReasons: c.reasons,
    source: input.source,
    batchId,
    recordedBy: actor.id,
    createdAt: recordedAt,
  }));
  for (const part of chunks(rows)) {
    await tx.insert(washCycles).values(part);
    await yieldToEventLoop();
  }
  const lots = rows.flatMap((r, i) =>
    (checked[i] as Checked).input.lots.map((lotNumber) => ({ lotNumber, cycleId: r.id })),
  );
  for (const part of chunks(lots, 2000)) {
    await tx.insert(washCycleLots).values(part);
    await yieldToEventLoop();
  }
  const flagged: FlaggedCycle[] = rows.flatMap((r, i) => {
    const c = checked[i] as Checked;
    return c.reasons.length === 0
      ? []
      : [
          {
            id: r.id,
            cycleNumber: r.cycleNumber,
            system: c.input.system,
            lots: c.input.lots,
            reasons: c.reasons,
            startedAt: r.startedAt,
            recipeId: c.recipeId,
            partFamilyId: c.familyId,
          },
        ];
  });
  await appendAudit(
    tx,
    actor,
    {
      eventType: "wash_cycles.recorded",
      recordType: "wash_cycle_batch",
      recordId: batchId,
      new: {
        source: input.source,
        count: rows.length,
        cycles: rows.slice(0, 50).map((r) => r.cycleNumber),
        flagged: flagged.length,
        ...(input.file ? { fileName: input.file.name, sha256: input.file.sha256 } : {}),
      },
    },
    now,
  );
  await recordCycleFlags(tx, actor, flagged);
  return {
    batchId,
    recorded: rows.length,
    cycles: rows.map((r) => ({ id: r.id, cycleNumber: r.cycleNumber, flagged: r.flagged })),
    flagged,
  };
}
