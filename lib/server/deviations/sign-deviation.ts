import "server-only";
import { getDb } from "@/db/client";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import { signDeviationIn } from "./sign-deviation-in";

/** The password is checked (and a wrong one counted) before the signing transaction. */
export async function signDeviation(
  actor: { id: string; name: string },
  input: {
    deviationId: string;
    meaning: "authored" | "approved";
    password: string;
    contentHash: string;
  },
  now = new Date(),
) {
  const signer = await verifySigner({ userId: actor.id, password: input.password }, now);
  await getDb().transaction((tx) => signDeviationIn(tx, signer, input, now));
}
