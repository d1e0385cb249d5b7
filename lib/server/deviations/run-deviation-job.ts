// Not "server-only": the demo seed runs it under tsx, as the server's timer does.
import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { deviations, recipes, userRoles, users } from "@/db/schema";
import { appendAudit, SYSTEM_ACTOR } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { daysLeft, expiryReason, reminderDue } from "@/lib/deviations/rules";
import { todayUtc } from "@/lib/format/date";
import { deviationEndingEmail } from "@/templates/email/deviation";
import { lotsUsedOf } from "./state";

/**
 * Records each approved deviation's expiry once (the pages already show it expired on read) and
 * e-mails its author and the approvers once per end date when the end is near. `onlyId` runs it
 * for one deviation (right after approval, so a short deviation is reminded at once).
 */
export async function runDeviationJobIn(tx: Tx, now = new Date(), onlyId?: string) {
  const today = todayUtc(now);
  const active = await tx
    .select({
      d: deviations,
      recipe: recipes.code,
      authorEmail: users.email,
      authorActive: users.active,
    })
    .from(deviations)
    .innerJoin(recipes, eq(recipes.id, deviations.recipeId))
    .innerJoin(users, eq(users.id, deviations.createdBy))
    .where(
      onlyId
        ? and(eq(deviations.status, "approved"), eq(deviations.id, onlyId))
        : eq(deviations.status, "approved"),
    );
  if (active.length === 0) return { expired: 0, reminded: 0 };
  const lots = await lotsUsedOf(
    tx,
    active.map((a) => a.d.id),
  );
  let expired = 0;
  let reminded = 0;
  let approvers: string[] | null = null;
  for (const { d, recipe, authorEmail, authorActive } of active) {
    const used = lots.get(d.id) ?? 0;
    const because = expiryReason(d, today, used);
    if (because) {
      await tx
        .update(deviations)
        .set({ status: "expired", endedAt: now.toISOString() })
        .where(and(eq(deviations.id, d.id), eq(deviations.status, "approved")));
      await appendAudit(
        tx,
        SYSTEM_ACTOR,
        {
          eventType: "deviation.expired",
          recordType: "deviation",
          recordId: d.id,
          old: { status: "approved" },
          new: { status: "expired", because, endsOn: d.endsOn, lotsUsed: used },
        },
        now,
      );
      expired += 1;
      continue;
    }
    if (!d.endsOn || d.remindedForEnd === d.endsOn || !reminderDue(d.endsOn, d.reminderDays, today))
      continue;
    approvers ??= (
      await tx
        .select({ email: users.email })
        .from(users)
        .innerJoin(userRoles, eq(userRoles.userId, users.id))
        .where(and(eq(userRoles.role, "approver"), eq(users.active, true)))
    ).map((u) => u.email);
    const to = [...new Set([...(authorActive ? [authorEmail] : []), ...approvers])];
    const left = daysLeft(d.endsOn, today)!;
    const mail = deviationEndingEmail({
      number: d.number,
      title: d.title,
      recipe,
      endsOn: d.endsOn,
      daysLeft: left,
      deviationId: d.id,
    });
    for (const address of to) await enqueueEmail(tx, { to: address, ...mail }, now);
    await tx.update(deviations).set({ remindedForEnd: d.endsOn }).where(eq(deviations.id, d.id));
    await appendAudit(
      tx,
      SYSTEM_ACTOR,
      {
        eventType: "deviation.reminder_sent",
        recordType: "deviation",
        recordId: d.id,
        new: { endsOn: d.endsOn, daysLeft: left, to },
      },
      now,
    );
    reminded += 1;
  }
  return { expired, reminded };
}

/** The timer's pass (instrumentation.ts). */
export async function runDeviationJob(now = new Date()) {
  return getDb().transaction((tx) => runDeviationJobIn(tx, now));
}
