import { and, eq } from "drizzle-orm";
import { appendAudit } from "@/lib/audit";
import { narrativeDocument } from "@/lib/changes/content";
import { addDays } from "@/lib/changes/emergency";
import type { RichDoc } from "@/lib/documents/rich-text";
import { todayUtc } from "@/lib/format/date";
import { proposalSchema } from "@/lib/schemas/change";
import { assessChange } from "@/lib/server/changes/assess-change";
import { implementEmergency } from "@/lib/server/changes/implement-emergency";
import { openChangeRequest } from "@/lib/server/changes/open-change-request";
import { saveProposal } from "@/lib/server/changes/save-proposal";
import { loadChangeState } from "@/lib/server/changes/state";
import { saveDraft } from "@/lib/server/documents/save-draft";
import type { Database } from "./client";
import { loadRecipeSnapshot, writeRecipeContent } from "./recipe-content";
import { recipes, recipeVersions, users } from "./schema";
import { DEMO_PASSWORD } from "./seed-data";

const DAY = 86_400_000;
const MINUTE = 60_000;
/** Midnight UTC of the day `days` before `now`, plus `hour` hours: demo steps fall on whole times. */
const dayBefore = (now: Date, days: number, hour: number) =>
  new Date(Math.floor(now.getTime() / DAY) * DAY - days * DAY + hour * 60 * MINUTE);

/**
 * An emergency change past its approval deadline: the bearing-cap recipe's final rinse was
 * lengthened six days ago after water stains, signed into force by the engineer, and no
 * approver has signed since. The server's escalation pass e-mails approvers and
 * administrators once. On a recipe of its own, so the other recipes stay free for changes.
 */
// The change request is made through the services the screens use, which write to the process
// database (getDb): a caller seeding another database calls setProcessDatabase first.
export async function seedChangeTypes(db: Database, now = new Date()) {
  const person = async (email: string) => {
    const [u] = await db.select().from(users).where(eq(users.email, email));
    return u ? { id: u.id, name: u.name } : null;
  };
  const engineer = await person("engineer@fennmoor.example");
  // The approver who put version 1 in force; without one, the engineer stands in for the history.
  const approver = (await person("approver@fennmoor.example")) ?? engineer;
  const [source] = await db
    .select({ version: recipeVersions, systemId: recipes.systemId })
    .from(recipes)
    .innerJoin(recipeVersions, eq(recipeVersions.recipeId, recipes.id))
    .where(and(eq(recipes.code, "R-AW3-VB"), eq(recipeVersions.status, "effective")));
  if (!engineer || !approver || !source) return;

  // Version 1 was drafted two weeks before it was validated and put in force, like the other
  // recipes of the plant's first year.
  const validatedAt = "2025-06-16T07:00:00.000Z";
  const draftedAt = new Date("2025-06-02T07:00:00.000Z");
  const content = await loadRecipeSnapshot(db, source.version.id);
  const recipeId = await db.transaction(async (tx) => {
    const [recipe] = await tx
      .insert(recipes)
      .values({
        systemId: source.systemId,
        code: "R-AW3-BC",
        name: "Bearing cap, ultrasonic",
        description: "Bearing caps in baskets of 36; same stages as the valve body.",
      })
      .returning();
    await appendAudit(
      tx,
      engineer,
      {
        eventType: "recipe.created",
        recordType: "recipe",
        recordId: recipe.id,
        new: { code: recipe.code, name: recipe.name },
      },
      draftedAt,
    );
    const [v1] = await tx
      .insert(recipeVersions)
      .values({
        recipeId: recipe.id,
        version: 1,
        status: "effective",
        detergent: content.detergent,
        notes: "Settings from the commissioning trials.",
        effectiveFrom: validatedAt,
        createdBy: engineer.id,
        createdAt: draftedAt.toISOString(),
      })
      .returning();
    await writeRecipeContent(tx, v1.id, {
      ...content,
      notes: "Settings from the commissioning trials.",
    });
    await appendAudit(
      tx,
      engineer,
      {
        eventType: "recipe_version.created",
        recordType: "recipe_version",
        recordId: v1.id,
        new: { recipe: recipe.code, version: 1, notes: "Settings from the commissioning trials." },
      },
      draftedAt,
    );
    await appendAudit(
      tx,
      approver,
      {
        eventType: "recipe_version.effective",
        recordType: "recipe_version",
        recordId: v1.id,
        new: { status: "effective", effectiveFrom: validatedAt },
      },
      new Date(validatedAt),
    );
    return recipe.id;
  });

  // From here on, through the services the screens use, late on the morning six days ago: the stains
  // are found on the caps shipped that morning, and the change is in force within the hour.
  const at = dayBefore(now, 6, 10);
  const step = (minutes: number) => new Date(at.getTime() + minutes * MINUTE);
  const actor = { ...engineer, roles: ["engineer" as const] };
  const cr = await openChangeRequest(
    engineer,
    { recipeId, title: "Lengthen the final rinse after water stains", kind: "parameter_change" },
    at,
  );
  const state = await loadChangeState(db, cr.id);
  const text = (v: number | null) => (v === null ? "" : String(v));
  await saveProposal(
    engineer,
    proposalSchema.parse({
      changeRequestId: cr.id,
      lockVersion: state.assessmentRow.lockVersion,
      title: state.cr.title,
      kind: "parameter_change",
      partFamilyId: "",
      raiseTo: "",
      raiseReason: "",
      recipe: {
        detergent: state.to.detergent ?? "",
        notes: "Final rinse lengthened after water stains on shipped caps.",
        stages: state.to.stages.map((st) => ({
          ...st,
          parameters: st.parameters.map((p) => ({
            ...p,
            setpoint: String(p.key === "rinse.time" ? 95 : p.setpoint),
            validatedLow: text(p.validatedLow),
            validatedHigh: text(p.validatedHigh),
          })),
        })),
      },
    }),
    step(10),
  );
  const narrative = (await loadChangeState(db, cr.id)).narrative!;
  await saveDraft(
    actor,
    {
      versionId: narrative.id,
      lockVersion: narrative.lockVersion,
      content: narrativeDocument(
        "Water stains on the caps shipped this morning: the final rinse leaves detergent film in the blind holes. A longer rinse inside the validated range clears it.\n\nRisk: none beyond the range already proven; drying time is unchanged.",
      ) as RichDoc,
      overwrite: false,
    },
    step(25),
  );
  const signed = async () => ({
    changeRequestId: cr.id,
    password: DEMO_PASSWORD,
    contentHash: (await loadChangeState(db, cr.id)).contentHash,
  });
  await assessChange(engineer, await signed(), step(35));
  await implementEmergency(
    engineer,
    {
      ...(await signed()),
      justification:
        "The customer's line stops tonight without clean caps; the approver is away for the next three days.",
      approvalDueOn: addDays(todayUtc(at), 3),
    },
    step(45),
  );
}
