import "server-only";
import { getDb } from "@/db/client";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { acknowledgeProcedureIn } from "./acknowledge-procedure-in";

/** The person's own password is checked before their acknowledgement is signed. */
export async function acknowledgeProcedure(
  actor: { id: string },
  input: { documentVersionId: string; password: string },
  now = new Date(),
) {
  const person = await verifySigner({ userId: actor.id, password: input.password }, now);
  return getDb().transaction((tx) => acknowledgeProcedureIn(tx, person, input, now));
}
