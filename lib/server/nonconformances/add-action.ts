import { and, eq } from "drizzle-orm";
import { getDb, type Tx } from "@/db/client";
import { nonconformanceActions, users } from "@/db/schema";
import { appendAudit, type AuditActor } from "@/lib/audit";
import { enqueueEmail } from "@/lib/email/outbox";
import { UserFacingError } from "@/lib/server/errors";
import { ncAssignedEmail } from "@/templates/email/nonconformance";
import { assertWorkable, loadNc } from "./shared";

export interface AddActionInput {
  nonconformanceId: string;
  kind: "corrective" | "preventive";
  description: string;
  ownerId: string;
  dueOn: string;
}

/** A corrective or preventive action with its owner and due date; the owner is told by e-mail. */
export async function addActionIn(
  tx: Tx,
  actor: AuditActor & { id: string },
  input: AddActionInput,
  now = new Date(),
  /** The demo's history is seeded without e-mail: nobody is waiting for it. */
  opts: { notify?: boolean } = {},
) {
  const nc = await loadNc(tx, input.nonconformanceId);
  assertWorkable(nc);
  if (nc.status === "effectiveness_check")
    throw new UserFacingError(
      "The effectiveness check is under way. If it shows the actions did not work, send the nonconformance back to actions first.",
    );
  if (input.dueOn < nc.detectedOn)
    throw new UserFacingError(
      `The due date cannot be before the nonconformance was detected (${nc.detectedOn}).`,
      { kind: "invalid", field: "dueOn" },
    );
  const [owner] = await tx
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(and(eq(users.id, input.ownerId), eq(users.active, true)));
  if (!owner)
    throw new UserFacingError("Choose an active person as the owner.", {
      kind: "invalid",
      field: "ownerId",
    });
  const [row] = await tx
    .insert(nonconformanceActions)
    .values({
      nonconformanceId: nc.id,
      kind: input.kind,
      description: input.description,
      ownerId: owner.id,
      dueOn: input.dueOn,
      createdBy: actor.id,
      createdAt: now.toISOString(),
    })
    .returning();
  await appendAudit(
    tx,
    actor,
    {
      eventType: "nonconformance.action_added",
      recordType: "nonconformance",
      recordId: nc.id,
      new: {
        action: row.id,
        kind: input.kind,
        description: input.description,
        owner: owner.name,
        dueOn: input.dueOn,
      },
    },
    now,
  );
  if (opts.notify !== false)
    await enqueueEmail(
      tx,
      {
        to: owner.email,
        ...ncAssignedEmail({
          number: nc.number,
          title: input.description,
          what: `${input.kind} action`,
          dueOn: input.dueOn,
          ncId: nc.id,
        }),
      },
      now,
    );
  return row;
}

export const addAction = (actor: AuditActor & { id: string }, input: AddActionInput) =>
  getDb().transaction((tx) => addActionIn(tx, actor, input));
