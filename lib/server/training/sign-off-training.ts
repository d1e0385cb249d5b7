import "server-only";
import { getDb } from "@/db/client";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { signOffTrainingIn } from "./sign-off-training-in";

/** The trainer's password is checked (and a wrong one counted) before the signing transaction. */
export async function signOffTraining(
  actor: { id: string },
  input: { userId: string; methodCode: string; trainedOn: string; password: string },
  now = new Date(),
) {
  const trainer = await verifySigner({ userId: actor.id, password: input.password }, now);
  return getDb().transaction((tx) => signOffTrainingIn(tx, trainer, input, now));
}
