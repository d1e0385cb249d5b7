import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { requalificationIntervals } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { requalificationDueEmail } from "@/templates/email/change-step";
import { dueRequalifications } from "./due-requalifications";
import { usersWithRole } from "./snapshot";

/** E-mails the engineers once per due date for each requalification that is due soon or overdue. */
export async function sendRequalificationReminders(now = new Date()) {
  return getDb().transaction(async (tx) => {
    const due = (await dueRequalifications(tx, now)).filter(
      (d) => d.interval.notifiedForDue !== d.due,
    );
    if (due.length === 0) return 0;
    const engineers = await usersWithRole(tx, "engineer");
    for (const d of due) {
      const mail = requalificationDueEmail({
        recipe: d.recipe.code,
        version: d.version.version,
        partFamily: `${d.family.code} ${d.family.name}`,
        due: d.due,
        overdue: d.state === "overdue",
        recipeId: d.recipe.id,
      });
      for (const e of engineers) await enqueueEmail(tx, { to: e.email, ...mail }, now);
      await tx
        .update(requalificationIntervals)
        .set({ notifiedForDue: d.due })
        .where(eq(requalificationIntervals.id, d.interval.id));
      await appendAudit(
        tx,
        SYSTEM_ACTOR,
        {
          eventType: "requalification_interval.reminder_sent",
          recordType: "requalification_interval",
          recordId: d.interval.id,
          new: { due: d.due, state: d.state, to: engineers.map((e) => e.email) },
        },
        now,
      );
    }
    return due.length;
  });
}
