"use server";

import { getDb } from "@/db/client";
import type { FormState } from "@/lib/actions/result";
import { appendAudit, verifyAuditChain } from "@/lib/audit";
import { authorize } from "@/lib/server/auth/current-user";
import { formatNumber } from "@/lib/format/number";

/** Re-computes the whole hash chain and reports where it breaks, if it does. */
export async function verifyIntegrityAction(_prev: FormState, _formData: FormData): Promise<FormState> {
  const auth = await authorize("audit.view");
  if (!auth.ok) return auth;
  const started = performance.now();
  const result = await verifyAuditChain(getDb());
  const ms = Math.round(performance.now() - started);
  // The check itself is recorded, after it ran, so it does not verify its own event.
  await getDb().transaction((tx) =>
    appendAudit(tx, { id: auth.user.id, name: auth.user.name }, {
      action: "audit.verified",
      recordType: "audit_trail",
      recordId: "chain",
      new: result.ok ? { ok: true, events: result.events } : { ok: false, brokenAt: result.brokenAt, reason: result.reason },
    }),
  );
  return result.ok
    ? { ok: true, message: `Intact: all ${formatNumber(result.events)} events verified in ${ms} ms; each links to the one before.` }
    : { ok: false, message: `Broken at event ${result.brokenAt}: ${result.reason}. ${result.events} events before it verified.` };
}
