"use server";

import { z } from "zod";
import { getDb } from "@/db/client";
import { defineAction } from "@/lib/actions/define-action";
import { appendAudit, verifyAuditChain } from "@/lib/audit";
import { formatNumber } from "@/lib/format/number";

/** Re-computes the whole hash chain and reports where it breaks, if it does. */
export const verifyIntegrityAction = defineAction({
  permission: "audit.view",
  input: z.object({}),
  run: async ({ user }) => {
    const started = performance.now();
    const result = await verifyAuditChain(getDb());
    const ms = Math.round(performance.now() - started);
    // The check itself is recorded, after it ran, so it does not verify its own event.
    await getDb().transaction((tx) =>
      appendAudit(tx, { id: user.id, name: user.name }, {
        eventType: "audit.verified",
        recordType: "audit_trail",
        recordId: "chain",
        new: result.ok ? { ok: true, events: result.events } : { ok: false, brokenAt: result.brokenAt, reason: result.reason },
      }),
    );
    return result.ok
      ? { message: `Intact: all ${formatNumber(result.events)} events verified in ${ms} ms; each links to the one before.` }
      : { ok: false as const, message: `Broken at event ${result.brokenAt}: ${result.reason}. ${result.events} events before it verified.` };
  },
});
