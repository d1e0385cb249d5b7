import { and, eq } from "drizzle-orm";
import type { Tx } from "./client";
import {
  cleaningSystems,
  maintenanceIntervals,
  recipes,
  recipeVersions,
  systemStages,
  users,
} from "./schema";
import { appendAudit } from "@/lib/audit";
import { asOf } from "@/lib/audit/seed-stamp";
import { bathLimitSchema, detergentSchema } from "@/lib/schemas/bath-plan";
import { bathRecordSchema } from "@/lib/schemas/evidence";
import { recordBathEntryIn } from "@/lib/server/bath/record-bath-entry";
import { saveDetergentIn } from "@/lib/server/bath/save-detergent";
import { setBathLimitIn } from "@/lib/server/bath/set-bath-limit";

const DAY = 86_400_000;

/**
 * The demo's detergent register, the measurement plans of two wash tanks (from the recipe versions
 * in force), a titrated reading and a top-up, a filter change with its rating and pressure, and
 * nozzle and foil-test intervals. Invented figures, saved through the services the screens use.
 */
export async function seedBathPlan(tx: Tx, now = new Date()) {
  const person = async (email: string) =>
    (
      await tx.select({ id: users.id, name: users.name }).from(users).where(eq(users.email, email))
    )[0];
  const engineer = await person("engineer@fennmoor.example");
  const technician = await person("technician@fennmoor.example");
  if (!engineer || !technician) return;
  const tank = async (system: string, position: number) =>
    (
      await tx
        .select({ stage: systemStages })
        .from(systemStages)
        .innerJoin(cleaningSystems, eq(cleaningSystems.id, systemStages.systemId))
        .where(and(eq(cleaningSystems.code, system), eq(systemStages.position, position)))
    )[0]?.stage;
  const effective = async (code: string) =>
    (
      await tx
        .select({ id: recipeVersions.id })
        .from(recipeVersions)
        .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
        .where(and(eq(recipes.code, code), eq(recipeVersions.status, "effective")))
    )[0]?.id;
  const at = (daysAgo: number, hour: number) => {
    const d = new Date(Math.floor(now.getTime() / DAY) * DAY - daysAgo * DAY + hour * 3_600_000);
    return d.toISOString().replace(/:\d\d\.\d{3}Z$/, "");
  };
  // The engineer set the register, the limits and the check intervals up one morning a month ago,
  // before the readings below were taken against them.
  const setUp = (minutes: number) =>
    new Date(new Date(`${at(30, 9)}:00Z`).getTime() + minutes * 60_000);

  const alkaline = await asOf(setUp(0), null, () =>
    saveDetergentIn(
      tx,
      engineer,
      detergentSchema.parse({
        name: "Alkaline cleaner AC-14 (mildly alkaline, silicate-free)",
        supplier: "Larchfield Chemie (demo)",
        titrationMethod: "10 mL bath sample, 0.1 mol/L HCl to the phenolphthalein end point",
        factorPctPerMl: 0.5,
      }),
      setUp(0),
    ),
  );
  const neutral = await asOf(setUp(5), null, () =>
    saveDetergentIn(
      tx,
      engineer,
      detergentSchema.parse({
        name: "Neutral cleaner NC-7",
        supplier: "Larchfield Chemie (demo)",
        titrationMethod: "20 mL bath sample, 0.1 mol/L HCl to pH 4.5",
        factorPctPerMl: 0.25,
      }),
      setUp(5),
    ),
  );

  const wash = await tank("AW-3", 1);
  const valveBody = await effective("R-AW3-VB");
  if (wash && valveBody) {
    const line = (values: Record<string, unknown>) =>
      asOf(setUp(20), null, () =>
        setBathLimitIn(
          tx,
          engineer,
          bathLimitSchema.parse({ stageId: wash.id, recipeVersionId: valveBody, ...values }),
          setUp(20),
        ),
      );
    // Reject limits left blank take the recipe's validated range (2–4 %, 50–65 °C).
    await line({
      variable: "concentrationPct",
      detergentId: alkaline.id,
      actionLow: 2.5,
      actionHigh: 3.5,
    });
    await line({ variable: "temperatureC", actionLow: 55, actionHigh: 63 });
    await line({
      variable: "ph",
      target: 10.5,
      actionLow: 10,
      actionHigh: 11.2,
      rejectLow: 9.5,
      rejectHigh: 11.8,
    });
    await line({ variable: "oilContentGPerL", actionHigh: 3, rejectHigh: 6 });
    const entry = (values: Record<string, unknown>) => {
      const input = bathRecordSchema.parse({ stageId: wash.id, ...values });
      const when = new Date(`${input.performedAt}:00Z`);
      return asOf(when, null, () => recordBathEntryIn(tx, technician, input, when));
    };
    await entry({
      kind: "reading",
      performedAt: at(3, 7),
      titrantVolumeMl: 5.9,
      ph: 10.6,
      temperatureC: 60.2,
      oilContentGPerL: 1.8,
    });
    await entry({
      kind: "addition",
      performedAt: at(2, 7),
      detergentId: alkaline.id,
      additionQuantity: 4,
      additionUnit: "L",
      additionLot: "AC14-2611-07",
    });
    // Oil creeping up with the skimmer out of service (its deviation: db/seed-deviations.ts): beyond
    // its action limit, so it waits in My queue for a skim by hand and a re-check.
    await entry({
      kind: "reading",
      performedAt: at(1, 7),
      titrantVolumeMl: 6.1,
      ph: 10.7,
      oilContentGPerL: 3.4,
    });
  }

  const spray = await tank("SC-1", 1);
  const fitting = await effective("R-SC1-SF");
  if (spray && fitting) {
    const line = (values: Record<string, unknown>) =>
      asOf(setUp(40), null, () =>
        setBathLimitIn(
          tx,
          engineer,
          bathLimitSchema.parse({ stageId: spray.id, recipeVersionId: fitting, ...values }),
          setUp(40),
        ),
      );
    await line({
      variable: "concentrationPct",
      detergentId: neutral.id,
      actionLow: 1.8,
      actionHigh: 2.6,
    });
    await line({ variable: "temperatureC", actionLow: 52, actionHigh: 58 });
    await line({
      variable: "ph",
      target: 8,
      actionLow: 7,
      actionHigh: 9,
      rejectLow: 6.5,
      rejectHigh: 9.5,
    });
    const input = bathRecordSchema.parse({
      stageId: spray.id,
      kind: "nozzle_check",
      performedAt: at(12, 9),
      checkResult: "pass",
      notes: "All 24 nozzles clear; spray pattern even",
    });
    const checkedAt = new Date(`${input.performedAt}:00Z`);
    await asOf(checkedAt, null, () => recordBathEntryIn(tx, technician, input, checkedAt));
    const filter = bathRecordSchema.parse({
      stageId: spray.id,
      kind: "filter_change",
      performedAt: at(5, 10),
      filterDescription: "Cartridge filter, polypropylene",
      filterRatingUm: 25,
      differentialPressureBar: 1.4,
    });
    const changedAt = new Date(`${filter.performedAt}:00Z`);
    await asOf(changedAt, null, () => recordBathEntryIn(tx, technician, filter, changedAt));
  }

  // Check intervals: the nozzle check falls due in the demo's queue, the foil test is in date.
  for (const [stage, kind, intervalDays] of [
    [spray, "nozzle_check", 14],
    [wash, "ultrasonic_foil_test", 90],
  ] as const) {
    if (!stage) continue;
    const since = setUp(60).toISOString();
    const [row] = await tx
      .insert(maintenanceIntervals)
      .values({
        stageId: stage.id,
        kind,
        intervalDays,
        warnDays: 2,
        createdBy: engineer.id,
        createdAt: since,
      })
      .returning();
    await appendAudit(
      tx,
      engineer,
      {
        eventType: "maintenance_interval.set",
        recordType: "maintenance_interval",
        recordId: row.id,
        old: null,
        new: { tank: stage.name, kind, intervalDays, warnDays: 2 },
      },
      new Date(since),
    );
  }
}
