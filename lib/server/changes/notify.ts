import "server-only";
import { eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { users, type Role } from "@/db/schema";
import { enqueueEmail } from "@/lib/email/outbox";
import { CHANGE_STATUS_LABELS, type ChangeStatus } from "@/lib/changes/workflow";
import { changeStepEmail } from "@/templates/email/change-step";
import { usersWithRole } from "./snapshot";

/** E-mails whoever must act next, in the step's transaction (sent after commit). */
export async function notifyNext(
  tx: Tx,
  input: {
    cr: { id: string; number: string; title: string };
    status: ChangeStatus;
    actorName: string;
    nextStep: string;
    roles?: Role[];
    userIds?: string[];
  },
) {
  const recipients = new Map<string, string>();
  for (const role of input.roles ?? [])
    for (const u of await usersWithRole(tx, role)) recipients.set(u.id, u.email);
  for (const id of input.userIds ?? []) {
    const [u] = await tx
      .select({ email: users.email, active: users.active })
      .from(users)
      .where(eq(users.id, id));
    if (u?.active) recipients.set(id, u.email);
  }
  const mail = changeStepEmail({
    number: input.cr.number,
    title: input.cr.title,
    status: CHANGE_STATUS_LABELS[input.status],
    actorName: input.actorName,
    nextStep: input.nextStep,
    changeRequestId: input.cr.id,
  });
  for (const to of recipients.values()) await enqueueEmail(tx, { to, ...mail });
}
