// Not "server-only": the demo seed signs off its technician's training under tsx.
import { and, eq } from "drizzle-orm";
import type { Tx } from "@/db/client";
import { labMethods, userRoles, users } from "@/db/schema";
import { appendAudit } from "@/lib/audit";
import { todayUtc } from "@/lib/format/date";
import { addMonths, trainingState } from "@/lib/training/rules";
import { UserFacingError } from "@/lib/server/errors";
import { methodLabel } from "@/lib/server/lab-methods/state";
import { insertSignedTraining, methodTrainingOf } from "./state";

/**
 * A trainer signs off a person's practical training on a lab method (its approved version). The
 * trainer is an approver or administrator, or someone whose own training on the method is
 * current; nobody signs off their own. Current from the day trained for the method's interval.
 */
export async function signOffTrainingIn(
  tx: Tx,
  trainer: { id: string; name: string },
  input: { userId: string; methodCode: string; trainedOn: string },
  now = new Date(),
) {
  const today = todayUtc(now);
  const [method] = await tx
    .select()
    .from(labMethods)
    .where(and(eq(labMethods.code, input.methodCode), eq(labMethods.status, "approved")));
  if (!method)
    throw new UserFacingError(`${input.methodCode} has no approved version to train on.`, {
      kind: "invalid",
      field: "methodCode",
    });
  const [person] = await tx
    .select({ id: users.id, name: users.name, active: users.active })
    .from(users)
    .where(eq(users.id, input.userId));
  if (!person || !person.active)
    throw new UserFacingError("Choose an active person.", { kind: "invalid", field: "userId" });
  if (person.id === trainer.id)
    throw new UserFacingError("Nobody signs off their own training: a trainer signs it.", {
      kind: "forbidden",
      field: "userId",
    });
  if (input.trainedOn > today)
    throw new UserFacingError("The training cannot be dated after today.", {
      kind: "invalid",
      field: "trainedOn",
    });
  const roles = (
    await tx
      .select({ role: userRoles.role })
      .from(userRoles)
      .where(eq(userRoles.userId, trainer.id))
  ).map((r) => r.role);
  if (!roles.includes("approver") && !roles.includes("admin")) {
    const own = await methodTrainingOf(tx, trainer.id, [method.code]);
    const state = trainingState(own[0]?.expiresOn, today);
    if (state === "never" || state === "lapsed")
      throw new UserFacingError(
        `You may sign off ${method.code} only while your own training on it is current (or as an approver or administrator).`,
        { kind: "forbidden" },
      );
  }
  const values = {
    userId: person.id,
    kind: "method" as const,
    methodCode: method.code,
    methodId: method.id,
    documentId: null,
    documentVersionId: null,
    trainedOn: input.trainedOn,
    expiresOn: addMonths(input.trainedOn, method.trainingIntervalMonths),
    trainerId: trainer.id,
  };
  const { row, contentHash } = await insertSignedTraining(tx, values, trainer, "verified", now);
  await appendAudit(
    tx,
    trainer,
    {
      eventType: "training.signed_off",
      recordType: "training_record",
      recordId: row.id,
      new: {
        person: person.name,
        method: methodLabel(method),
        trainedOn: values.trainedOn,
        expiresOn: values.expiresOn,
        trainer: trainer.name,
        contentHash,
      },
    },
    now,
  );
  return {
    id: row.id,
    expiresOn: values.expiresOn,
    person: person.name,
    method: methodLabel(method),
  };
}
