"use server";

import { getDb } from "@/db/client";
import type { FormState } from "@/lib/actions/result";
import { appendAudit } from "@/lib/audit";
import { deliverSoon } from "@/lib/email/deliver";
import { checkIntegrity } from "@/lib/server/audit/check-integrity";
import { integritySummary, type IntegrityState } from "@/lib/server/audit/integrity-summary";
import { writeCheckpoint } from "@/lib/server/audit/write-checkpoint";
import { authorize } from "@/lib/server/auth/current-user";
import { toActionFailure } from "@/lib/server/errors";

/** Re-computes the whole hash chain, compares it with the signed checkpoints and re-checks every signature. */
export async function verifyIntegrityAction(_prev: IntegrityState, _formData: FormData): Promise<IntegrityState> {
  const auth = await authorize("audit.view");
  if (!auth.ok) return auth;
  const started = performance.now();
  const report = await checkIntegrity(getDb());
  const ms = Math.round(performance.now() - started);
  // The check itself is recorded, after it ran, so it does not verify its own event.
  await getDb().transaction((tx) =>
    appendAudit(tx, { id: auth.user.id, name: auth.user.name }, {
      action: "audit.verified",
      recordType: "audit_trail",
      recordId: "chain",
      new: { ok: report.ok, events: report.chain.events, checkpoints: report.checkpoints.count, signatures: report.signatures.checked, findings: report.findings.slice(0, 50) },
    }),
  );
  return integritySummary(report, ms);
}

/** Signs the chain's current head now and stores it outside the database. */
export async function writeCheckpointAction(_prev: FormState, _formData: FormData): Promise<FormState> {
  const auth = await authorize("audit.view");
  if (!auth.ok) return auth;
  try {
    const result = await writeCheckpoint({ id: auth.user.id, name: auth.user.name });
    if (!result.written) return { ok: false, message: result.reason };
    if (result.emailedTo) deliverSoon();
    const cp = result.checkpoint;
    return {
      ok: true,
      message: `Checkpoint signed: event ${cp.seq}, hash ${cp.hash.slice(0, 16)}…, key ${cp.keyId}, kept in ${result.where}${result.emailedTo ? `; a copy was e-mailed to ${result.emailedTo}` : ""}.`,
    };
  } catch (error) {
    return toActionFailure(error);
  }
}
