import "server-only";
import { stepProblem, type ChangeStep } from "@/lib/changes/workflow";
import { UserFacingError } from "@/lib/server/errors";
import type { ChangeState } from "./state";

/** Refuses a step the lifecycle does not allow from the current status (21 CFR 11.10(f)). */
export function assertStep(state: ChangeState, step: ChangeStep) {
  const problem = stepProblem(step, state.cr.status, state.requirements.length);
  if (problem) throw new UserFacingError(problem);
}

/** The signer must sign exactly what they saw: the hash in the dialog must still be the record's hash. */
export function assertHash(state: ChangeState, signedHash: string) {
  if (signedHash !== state.contentHash) {
    throw new UserFacingError(
      "The change request changed since you opened it. Nothing was signed: reload, read it again and sign.",
    );
  }
}
