import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { nonconformances, userRoles, users } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { UserFacingError } from "@/lib/server/errors";
import { ncAssignedEmail } from "@/templates/email/nonconformance";
import { assertWorkable, loadNc } from "./shared";

/** Names the engineer who owns the nonconformance (and its due date) and tells them by e-mail. */
export async function assignNonconformanceIn(
  tx: Tx,
  actor: AuditActor,
  input: { nonconformanceId: string; ownerId: string; dueOn: string | null },
  now = new Date(),
  /** The demo's history is seeded without e-mail: nobody is waiting for it. */
  opts: { notify?: boolean } = {},
) {
  const nc = await loadNc(tx, input.nonconformanceId);
  assertWorkable(nc);
  const [owner] = await tx
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .innerJoin(userRoles, eq(userRoles.userId, users.id))
    .where(
      and(eq(users.id, input.ownerId), eq(userRoles.role, "engineer"), eq(users.active, true)),
    );
  if (!owner)
    throw new UserFacingError("Choose an active quality engineer as the owner.", {
      kind: "invalid",
      field: "ownerId",
    });
  if (input.dueOn && input.dueOn < nc.detectedOn)
    throw new UserFacingError(
      `The due date cannot be before the detection date (${nc.detectedOn}).`,
      {
        kind: "invalid",
        field: "dueOn",
      },
    );
  const previous = nc.ownerId
    ? (await tx.select({ name: users.name }).from(users).where(eq(users.id, nc.ownerId)))[0]
    : null;
  await tx
    .update(nonconformances)
    .set({ ownerId: owner.id, dueOn: input.dueOn })
    .where(eq(nonconformances.id, nc.id));
  await appendAudit(
    tx,
    actor,
    {
      eventType: "nonconformance.assigned",
      recordType: "nonconformance",
      recordId: nc.id,
      old: { owner: previous?.name ?? null, dueOn: nc.dueOn },
      new: { owner: owner.name, dueOn: input.dueOn },
    },
    now,
  );
  if (owner.id !== nc.ownerId && opts.notify !== false)
    await enqueueEmail(
      tx,
      {
        to: owner.email,
        ...ncAssignedEmail({
          number: nc.number,
          title: nc.title,
          what: "nonconformance",
          dueOn: input.dueOn,
          ncId: nc.id,
        }),
      },
      now,
    );
}

export const assignNonconformance = (
  actor: AuditActor,
  input: Parameters<typeof assignNonconformanceIn>[2],
) => getDb().transaction((tx) => assignNonconformanceIn(tx, actor, input));
