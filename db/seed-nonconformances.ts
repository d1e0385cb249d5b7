import { and, asc, eq, gt } from "drizzle-orm";
import { doc, p, ol } from "@/lib/documents/rich-text";
import { todayUtc } from "@/lib/format/date";
import { addActionIn } from "@/lib/server/nonconformances/add-action";
import { advanceNonconformanceIn } from "@/lib/server/nonconformances/advance";
import { assignNonconformanceIn } from "@/lib/server/nonconformances/assign";
import { planEffectivenessIn } from "@/lib/server/nonconformances/plan-effectiveness";
import { raiseNonconformance } from "@/lib/server/nonconformances/raise";
import { recordEffectivenessIn } from "@/lib/server/nonconformances/record-effectiveness";
import { saveRootCauseIn } from "@/lib/server/nonconformances/save-root-cause";
import { setDispositionIn } from "@/lib/server/nonconformances/set-disposition";
import { setItemHoldIn } from "@/lib/server/nonconformances/set-item-hold";
import { ncHash, loadNc } from "@/lib/server/nonconformances/shared";
import { signClosureIn } from "@/lib/server/nonconformances/sign-closure";
import { updateActionIn } from "@/lib/server/nonconformances/update-action";
import type { Tx } from "./client";
import { nonconformanceItems, recipeVersions, testRuns } from "./schema";
import { TEST_TYPE_LABELS } from "@/lib/recipes/test-types";

type Person = { id: string; name: string };
/** History needs no e-mail: nobody is waiting for an assignment made in the demo's past. */
const QUIET = { notify: false };

/** A day of the demo's history at a given UTC hour, so every record sits on its real date. */
const at = (date: string, hour: number) =>
  new Date(`${date}T${String(hour).padStart(2, "0")}:00:00.000Z`);
const addDays = (date: string, days: number) =>
  todayUtc(new Date(Date.parse(`${date}T00:00:00Z`) + days * 86_400_000));

/**
 * Every demo run verified as Fail is owned by a nonconformance, raised on the day it was
 * verified, through the same services the screens use. The first is worked to a signed
 * closure (cause, actions, effectiveness confirmed by the next passing run); the others stay
 * open at different steps.
 */
export async function seedNonconformances(tx: Tx, people: { engineer: Person; approver: Person }) {
  const failed = await tx
    .select({ run: testRuns, recipeId: recipeVersions.recipeId })
    .from(testRuns)
    .innerJoin(recipeVersions, eq(recipeVersions.id, testRuns.recipeVersionId))
    .where(and(eq(testRuns.status, "verified"), eq(testRuns.outcome, "fail")))
    .orderBy(asc(testRuns.performedOn), asc(testRuns.number));
  const { engineer, approver } = people;
  for (const [index, { run, recipeId }] of failed.entries()) {
    const day = run.performedOn ?? todayUtc(new Date(run.createdAt));
    const { id } = await raiseNonconformance(
      tx,
      {
        source: { kind: "run", id: run.id, label: run.number },
        title: `${run.number} verified as Fail (${TEST_TYPE_LABELS[run.testType].toLowerCase()})`,
        description: `Test run ${run.number} was verified with the outcome Fail against its specification. Contain what was cleaned on this recipe and part family since the last passing test.`,
        severity: "major",
        detectedOn: day,
        recipeId,
        partFamilyId: run.partFamilyId,
        actorId: engineer.id,
      },
      at(day, 17),
    );
    await assignNonconformanceIn(
      tx,
      engineer,
      { nonconformanceId: id, ownerId: engineer.id, dueOn: addDays(day, 30) },
      at(day, 17),
      QUIET,
    );
    const items = await tx
      .select()
      .from(nonconformanceItems)
      .where(eq(nonconformanceItems.nonconformanceId, id));
    // Every failure's containment is decided the next morning: the failed run's parts are held.
    for (const item of items)
      await setItemHoldIn(
        tx,
        engineer,
        {
          nonconformanceId: id,
          itemId: item.id,
          hold: item.itemId === run.id ? "held" : "released",
        },
        at(addDays(day, 1), 8),
      );
    await advanceNonconformanceIn(
      tx,
      engineer,
      { nonconformanceId: id, to: "contained" },
      at(addDays(day, 1), 9),
    );
    if (index === 0) await workToClosure(tx, { id, run, recipeId, day, engineer, approver });
  }
}

async function workToClosure(
  tx: Tx,
  c: {
    id: string;
    run: typeof testRuns.$inferSelect;
    recipeId: string;
    day: string;
    engineer: Person;
    approver: Person;
  },
) {
  const { id, run, day, engineer, approver } = c;
  const [held] = await tx
    .select()
    .from(nonconformanceItems)
    .where(
      and(eq(nonconformanceItems.nonconformanceId, id), eq(nonconformanceItems.itemId, run.id)),
    );
  await setDispositionIn(
    tx,
    engineer,
    {
      nonconformanceId: id,
      itemId: held.id,
      disposition: "reclean",
      recleanRecipeId: c.recipeId,
      note: "Re-cleaned on the same recipe with a fresh filter, then retested.",
    },
    at(addDays(day, 2), 10),
  );
  await saveRootCauseIn(
    tx,
    engineer,
    {
      nonconformanceId: id,
      method: "five_whys",
      content: doc(
        p(
          "Why were particles above the class limits? They were carried back onto the parts by the wash bath.",
        ),
        ol(
          "Why did the bath carry them? The bag filter was loaded beyond its rating.",
          "Why was it overloaded? The filter interval was set by calendar, not by throughput.",
          "Why by calendar? Throughput doubled in May and the interval was never reviewed.",
        ),
        p("Root cause: the filter change interval does not follow throughput."),
      ),
    },
    at(addDays(day, 3), 11),
  );
  await advanceNonconformanceIn(
    tx,
    engineer,
    { nonconformanceId: id, to: "cause_found" },
    at(addDays(day, 3), 12),
  );
  const corrective = await addActionIn(
    tx,
    engineer,
    {
      nonconformanceId: id,
      kind: "corrective",
      description: "Change the bag filter every 5 production days instead of every 10",
      ownerId: engineer.id,
      dueOn: addDays(day, 10),
    },
    at(addDays(day, 3), 13),
    QUIET,
  );
  const preventive = await addActionIn(
    tx,
    engineer,
    {
      nonconformanceId: id,
      kind: "preventive",
      description: "Review filter intervals whenever weekly throughput changes by more than 25 %",
      ownerId: engineer.id,
      dueOn: addDays(day, 20),
    },
    at(addDays(day, 3), 13),
    QUIET,
  );
  await advanceNonconformanceIn(
    tx,
    engineer,
    { nonconformanceId: id, to: "actions_under_way" },
    at(addDays(day, 3), 14),
  );
  await updateActionIn(
    tx,
    engineer,
    {
      nonconformanceId: id,
      actionId: corrective.id,
      status: "done",
      evidenceLink: "Bath and filter log, wash tank: filter changes from this date on",
    },
    at(addDays(day, 8), 9),
  );
  await updateActionIn(
    tx,
    engineer,
    {
      nonconformanceId: id,
      actionId: preventive.id,
      status: "done",
      evidenceLink: "Maintenance procedure, revised",
    },
    at(addDays(day, 15), 9),
  );
  // The next passing verified run on the same recipe and part family shows the fix held.
  const [next] = await tx
    .select()
    .from(testRuns)
    .innerJoin(recipeVersions, eq(recipeVersions.id, testRuns.recipeVersionId))
    .where(
      and(
        eq(recipeVersions.recipeId, c.recipeId),
        eq(testRuns.partFamilyId, run.partFamilyId),
        eq(testRuns.status, "verified"),
        eq(testRuns.outcome, "pass"),
        gt(testRuns.performedOn, day),
      ),
    )
    .orderBy(asc(testRuns.performedOn))
    .limit(1);
  if (!next) return;
  const checkDay = next.test_runs.performedOn!;
  await planEffectivenessIn(
    tx,
    engineer,
    {
      nonconformanceId: id,
      criterion:
        "The next verified particle cleanliness run on this recipe and part family passes.",
      dueOn: addDays(checkDay, 7),
    },
    at(addDays(day, 15), 10),
  );
  await advanceNonconformanceIn(
    tx,
    engineer,
    { nonconformanceId: id, to: "effectiveness_check" },
    at(addDays(day, 15), 11),
  );
  await recordEffectivenessIn(
    tx,
    engineer,
    {
      nonconformanceId: id,
      result: "confirmed",
      evidenceRunNumber: next.test_runs.number,
      evidenceFileId: null,
      note: null,
    },
    at(checkDay, 18),
  );
  const hash = await ncHash(tx, await loadNc(tx, id));
  await signClosureIn(
    tx,
    engineer,
    { nonconformanceId: id, meaning: "authored", contentHash: hash },
    at(addDays(checkDay, 1), 9),
  );
  await signClosureIn(
    tx,
    approver,
    { nonconformanceId: id, meaning: "approved", contentHash: hash },
    at(addDays(checkDay, 1), 14),
  );
}
