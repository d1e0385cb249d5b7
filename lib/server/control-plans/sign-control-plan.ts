import "server-only";
import { getDb } from "@/db/client";
import { verifySigner } from "@/lib/server/signatures/verify-signer";
import {
  returnControlPlanIn,
  signControlPlanIn,
  type ControlPlanMeaning,
} from "./sign-control-plan-in";

/** The password is checked (and a wrong one counted) before the signing transaction. */
export async function signControlPlan(
  actor: { id: string; name: string },
  input: { versionId: string; meaning: ControlPlanMeaning; password: string; contentHash: string },
  now = new Date(),
) {
  const signer = await verifySigner({ userId: actor.id, password: input.password }, now);
  return getDb().transaction((tx) => signControlPlanIn(tx, signer, input, now));
}

export async function returnControlPlan(
  actor: { id: string; name: string },
  input: { versionId: string; reason: string },
  now = new Date(),
) {
  return getDb().transaction((tx) => returnControlPlanIn(tx, actor, input, now));
}
