// Not "server-only": the demo seed cites its methods under tsx; the action calls `citeMethods`.
import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { testRunMethods, testRuns, testSamples } from "@/db/schema";
import { METHOD_KINDS_BY_TEST } from "@/lib/lab-methods/kinds";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { citedLowerLimitProblem } from "@/lib/lab-methods/rules";
import type { CiteMethodsInput } from "@/lib/schemas/lab-method";
import { LAB_METHOD_KIND_LABELS } from "@/lib/schemas/lab-method";
import type { ParticleRunData, ParticleSample } from "@/lib/schemas/evidence";
import { UserFacingError } from "@/lib/server/errors";
import { methodsByIds, methodLabel } from "@/lib/server/lab-methods/state";
import { getRunMethods } from "./run-methods";

const KINDS = ["extraction", "analysis", "gravimetric"] as const;

/**
 * Records the method versions an open run used. Each must be an approved version of its kind and
 * belong to the run's test type; an analysis method must see every class the run counted. The
 * citation is part of the run's content hash.
 */
export async function citeMethodsIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  input: CiteMethodsInput,
  now = new Date(),
) {
  const [run] = await tx.select().from(testRuns).where(eq(testRuns.id, input.runId));
  if (!run) throw new UserFacingError("This test run does not exist.", { kind: "not_found" });
  if (run.status !== "open")
    throw new UserFacingError(
      `This run is ${run.status} and locked. To correct it, make a new revision with a reason.`,
      { kind: "locked" },
    );
  const allowed = METHOD_KINDS_BY_TEST[run.testType] ?? [];
  const chosen = KINDS.flatMap((kind) => (input[kind] ? [{ kind, id: input[kind]! }] : []));
  const rows = new Map(
    (
      await methodsByIds(
        tx,
        chosen.map((c) => c.id),
      )
    ).map((m) => [m.id, m]),
  );
  for (const { kind, id } of chosen) {
    const label = LAB_METHOD_KIND_LABELS[kind];
    if (!allowed.includes(kind))
      throw new UserFacingError(
        `A ${run.testType.replace("_", " ")} run cites no ${label.toLowerCase()}.`,
        {
          kind: "invalid",
          field: kind,
        },
      );
    const m = rows.get(id);
    if (!m || m.kind !== kind)
      throw new UserFacingError(`Choose a ${label.toLowerCase()} from the list.`, {
        kind: "invalid",
        field: kind,
      });
    if (m.status !== "approved")
      throw new UserFacingError(
        `${label} ${methodLabel(m)} is ${m.status === "draft" ? "a draft, not yet approved" : "superseded by a later version"}: a run cites only an approved version.`,
        { kind: "invalid", field: kind },
      );
    if (kind === "analysis") {
      const limit = Number((m.details as { lowerSizeLimitUm?: number }).lowerSizeLimitUm);
      const samples = await tx.select().from(testSamples).where(eq(testSamples.runId, run.id));
      const counted = samples.map((s) => ({
        label: `Sample ${s.sampleLabel}`,
        counts: (s.data as ParticleSample).counts ?? {},
      }));
      const blank = (run.runData as ParticleRunData | null)?.blank;
      if (blank) counted.push({ label: "The blank", counts: blank.counts });
      const problem = citedLowerLimitProblem(counted, limit, kind);
      if (problem)
        throw new UserFacingError(problem.message, { kind: "invalid", field: problem.field });
    }
  }
  const before = await getRunMethods(tx, run.id);
  const describe = (list: { kind: string; code: string; version: number }[]) =>
    Object.fromEntries(
      KINDS.map((k) => {
        const m = list.find((x) => x.kind === k);
        return [k, m ? methodLabel(m) : null];
      }),
    ) as Record<(typeof KINDS)[number], string | null>;
  await tx.delete(testRunMethods).where(and(eq(testRunMethods.runId, run.id)));
  if (chosen.length)
    await tx
      .insert(testRunMethods)
      .values(chosen.map((c) => ({ runId: run.id, kind: c.kind, methodId: c.id })));
  const after = chosen.map((c) => rows.get(c.id)!);
  await appendAudit(
    tx,
    actor,
    {
      eventType: "test_run.methods_cited",
      recordType: "test_run",
      recordId: run.id,
      old: describe(before),
      new: describe(after),
    },
    now,
  );
  return { cited: after.map((m) => methodLabel(m)) };
}

export async function citeMethods(actor: AuditActor & { id: string }, input: CiteMethodsInput) {
  return getDb().transaction((tx) => citeMethodsIn(tx, actor, input));
}
