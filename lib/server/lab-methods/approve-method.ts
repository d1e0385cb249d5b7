import "server-only";
import { getDb } from "@/db/client";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { approveMethodIn } from "./approve-method-in";

/** The password is checked (and a wrong one counted) before the signing transaction. */
export async function approveMethod(
  actor: { id: string },
  input: { methodId: string; password: string; contentHash: string },
  now = new Date(),
) {
  const signer = await verifySigner({ userId: actor.id, password: input.password }, now);
  await getDb().transaction((tx) => approveMethodIn(tx, signer, input, now));
}
