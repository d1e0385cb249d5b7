import { and, asc, eq } from "drizzle-orm";
import type { Tx } from "./client";
import {
  partFamilies,
  recipes,
  recipeVersions,
  requalificationIntervals,
  systemStages,
} from "./schema";
import { createControlPlanSchema } from "@/lib/schemas/control-plan";
import { createControlPlanIn } from "@/lib/server/control-plans/create-control-plan";
import { signControlPlanIn } from "@/lib/server/control-plans/sign-control-plan-in";
import { loadControlPlan } from "@/lib/server/control-plans/state";

const DAY = 86_400_000;
type Person = { id: string; name: string };

/**
 * The control plan of the valve body on its effective wash recipe, through the services the
 * screens use: drafted and signed by the engineer twelve days ago, reviewed the next day and
 * approved the day after. Its particle test every 5 cycles and its per-shift concentration
 * titration have fallen behind the demo's cycles and bath log, so the technician's queue shows them.
 */
export async function seedControlPlans(
  tx: Tx,
  people: { engineer: Person; reviewer: Person; approver: Person },
  now = new Date(),
) {
  const at = (daysAgo: number, hour: number) => {
    const d = new Date(now.getTime() - daysAgo * DAY);
    d.setUTCHours(hour, 0, 0, 0);
    return d;
  };
  const [combination] = await tx
    .select({ versionId: recipeVersions.id, familyId: partFamilies.id, systemId: recipes.systemId })
    .from(requalificationIntervals)
    .innerJoin(recipeVersions, eq(recipeVersions.id, requalificationIntervals.recipeVersionId))
    .innerJoin(recipes, eq(recipes.id, recipeVersions.recipeId))
    .innerJoin(partFamilies, eq(partFamilies.id, requalificationIntervals.partFamilyId))
    .where(
      and(
        eq(recipes.code, "R-AW3-VB"),
        eq(recipeVersions.status, "effective"),
        eq(partFamilies.code, "PF-VB-210"),
      ),
    );
  if (!combination) return;
  const stages = await tx
    .select({ id: systemStages.id, kind: systemStages.kind })
    .from(systemStages)
    .where(eq(systemStages.systemId, combination.systemId))
    .orderBy(asc(systemStages.position));
  const washTank = stages[0];
  const input = createControlPlanSchema.parse({
    combination: `${combination.versionId}:${combination.familyId}`,
    lines: [
      {
        characteristic: "particle_cleanliness",
        method: "Pressure-rinse extraction to VDA 19.1, 5 µm membrane, light microscope",
        stageId: "",
        sampleSize: "5",
        minCycles: "3",
        frequency: "every_n_cycles",
        everyN: "5",
        reactionPlan:
          "Hold the lots washed since the last passing test, raise a nonconformance, re-clean and retest the held lots.",
      },
      {
        characteristic: "bath_concentration",
        method: "Titration of a 10 mL bath sample",
        stageId: washTank.id,
        sampleSize: "1",
        minCycles: "",
        frequency: "per_shift",
        everyN: "",
        reactionPlan:
          "Below the action limit: top up by the data sheet and titrate again. Beyond reject: stop the washer and call the engineer.",
      },
      {
        characteristic: "final_rinse_conductivity",
        method: "Conductivity of the final rinse water, inline probe read at the panel",
        stageId: "",
        sampleSize: "1",
        minCycles: "",
        frequency: "daily",
        everyN: "",
        reactionPlan:
          "Above the limit: regenerate the deionisation cartridge before the next cycle.",
      },
      {
        characteristic: "gravimetric_residue",
        method: "Residue on a 0.8 µm membrane, weighed to 0.1 mg",
        stageId: "",
        sampleSize: "3",
        minCycles: "3",
        frequency: "weekly",
        everyN: "",
        reactionPlan: "Hold the week's lots; raise a nonconformance and check the filters.",
      },
    ],
  });
  const { planId, versionId } = await createControlPlanIn(tx, people.engineer, input, at(12, 8));
  const { contentHash } = (await loadControlPlan(tx, planId)).versions[0];
  const sign = (who: Person, meaning: "authored" | "reviewed" | "approved", when: Date) =>
    signControlPlanIn(tx, who, { versionId, meaning, contentHash }, when);
  await sign(people.engineer, "authored", at(12, 10));
  await sign(people.reviewer, "reviewed", at(11, 9));
  await sign(people.approver, "approved", at(10, 14));
}
