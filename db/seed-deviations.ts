import { deviationSchema } from "@/lib/schemas/deviation";
import { createDeviationIn } from "@/lib/server/deviations/create-deviation";
import { recordDeviationLotIn } from "@/lib/server/deviations/record-lot";
import { runDeviationJobIn } from "@/lib/server/deviations/run-deviation-job";
import { signDeviationIn } from "@/lib/server/deviations/sign-deviation-in";
import { loadDeviation } from "@/lib/server/deviations/state";
import { todayUtc } from "@/lib/format/date";
import type { Tx } from "./client";
import { DEMO_USERS } from "./seed-data";

interface Ids {
  userIds: Map<string, string>;
  recipeIds: Map<string, string>;
  familyIds: Map<string, string>;
}

const DAY = 86_400_000;

/**
 * Two invented deviations, through the services the screens use: one active on the valve-body
 * wash (a stronger bath carries the oil while the tank's skimmer is repaired; the bath log shows
 * the oil rising, db/seed-bath-plan.ts), and
 * one on the fitting dryer whose last day has passed, which the expiry job ended the next morning.
 */
export async function seedDeviations(tx: Tx, ids: Ids, now = new Date()) {
  const person = (email: string) => ({
    id: ids.userIds.get(email)!,
    name: DEMO_USERS.find((u) => u.email === email)!.name,
  });
  const engineer = person("engineer@fennmoor.example");
  const approver = person("approver@fennmoor.example");
  const technician = person("technician@fennmoor.example");
  if (!engineer.id || !approver.id || !technician.id) return;
  const daysAgo = (n: number, hour = 9) => {
    const d = new Date(now.getTime() - n * DAY);
    d.setUTCHours(hour, 0, 0, 0);
    return d;
  };

  async function approved(
    input: Parameters<typeof deviationSchema.parse>[0],
    draftedDaysAgo: number,
    approvedDaysAgo: number,
  ) {
    const { id } = await createDeviationIn(
      tx,
      engineer,
      deviationSchema.parse(input),
      daysAgo(draftedDaysAgo),
    );
    const { contentHash } = await loadDeviation(tx, id, daysAgo(draftedDaysAgo));
    await signDeviationIn(
      tx,
      engineer,
      { deviationId: id, meaning: "authored", contentHash },
      daysAgo(draftedDaysAgo, 10),
    );
    await signDeviationIn(
      tx,
      approver,
      { deviationId: id, meaning: "approved", contentHash },
      daysAgo(approvedDaysAgo, 14),
    );
    return id;
  }

  const dryer = await approved(
    {
      recipeId: ids.recipeIds.get("R-SC1-SF")!,
      title: "Dry fittings at 90 °C while the dryer's second heater bank is replaced",
      justification:
        "One of the two heater banks of the SC-1 dryer failed; the replacement is on order. With one bank the dryer holds 90 °C, below the validated 95 °C.",
      riskLevel: "medium",
      risk: "Water left in the thread roots. Contained by a longer drying time at the operator's discretion and a dryness check on the first part of every basket.",
      endsOn: todayUtc(daysAgo(20)),
      maxLots: "",
      reminderDays: "3",
      partFamilyIds: [ids.familyIds.get("PF-SF-12")!],
      parameters: [{ key: "drying.temperature", temporaryLow: "90", temporaryHigh: "110" }],
    },
    45,
    44,
  );
  for (const [lot, ago] of [
    ["SF12-L2610-03", 40],
    ["SF12-L2610-09", 33],
  ] as const)
    await recordDeviationLotIn(tx, technician, { deviationId: dryer, lot }, daysAgo(ago, 11));
  // The job's pass three days before the dryer deviation's last day: its reminder e-mail.
  await runDeviationJobIn(tx, daysAgo(23, 6));
  // Its pass the morning after that last day ends the dryer deviation and records why, so the
  // deviation shows the day it really ended, not the day the demo was loaded.
  await runDeviationJobIn(tx, daysAgo(19, 6));

  const skimmer = await approved(
    {
      recipeId: ids.recipeIds.get("R-AW3-VB")!,
      title: "Wash concentration up to 4.5 % while the tank 1 oil skimmer is repaired",
      justification:
        "The belt skimmer of the AW-3 wash tank failed; the spare belt is on order. Without skimming the bath carries more oil, and AC-14 at up to 4.5 %, above the validated 2–4 %, keeps it emulsified until the skimmer runs again.",
      riskLevel: "low",
      risk: "Residue of the stronger bath on the valve bodies. Contained by rinse conductivity checked every shift, the oil content read at every bath reading, and one particle test on the first lot cleaned under this deviation.",
      endsOn: todayUtc(new Date(now.getTime() + 24 * DAY)),
      maxLots: "40",
      reminderDays: "3",
      partFamilyIds: [ids.familyIds.get("PF-VB-210")!],
      parameters: [{ key: "wash.concentration", temporaryLow: "2", temporaryHigh: "4.5" }],
    },
    6,
    5,
  );
  for (const [lot, ago] of [
    ["VB210-L2611-27", 4],
    ["VB210-L2611-28", 3],
    ["VB210-L2612-01", 1],
  ] as const)
    await recordDeviationLotIn(tx, technician, { deviationId: skimmer, lot }, daysAgo(ago, 11));
}
