"use server";

import { z } from "zod";
import { getDb } from "@/db/client";
import { defineAction } from "@/lib/actions/define-action";
import { appendAudit } from "@/lib/audit";
import { checkIntegrity } from "@/lib/server/audit/check-integrity";
import { integritySummary } from "@/lib/server/audit/integrity-summary";
import { writeCheckpoint } from "@/lib/server/audit/write-checkpoint";

/** Re-computes the whole hash chain, compares it with the signed checkpoints and re-checks every signature. */
export const verifyIntegrityAction = defineAction({
  permission: "audit.view",
  input: z.object({}),
  run: async ({ user }) => {
    const started = performance.now();
    const report = await checkIntegrity(getDb());
    const ms = Math.round(performance.now() - started);
    // The check itself is recorded, after it ran, so it does not verify its own event.
    await getDb().transaction((tx) =>
      appendAudit(
        tx,
        { id: user.id, name: user.name },
        {
          eventType: "audit.verified",
          recordType: "audit_trail",
          recordId: "chain",
          new: {
            ok: report.ok,
            events: report.chain.events,
            checkpoints: report.checkpoints.count,
            signatures: report.signatures.checked,
            findings: report.findings.slice(0, 50),
          },
        },
      ),
    );
    const summary = integritySummary(report, ms);
    return summary.ok
      ? { message: summary.message, findings: summary.findings }
      : { ok: false as const, message: summary.message, findings: summary.findings };
  },
});

/** Signs the chain's current head now and stores it outside the database. */
export const writeCheckpointAction = defineAction({
  permission: "audit.view",
  input: z.object({}),
  sendsMail: true,
  run: async ({ user }) => {
    const result = await writeCheckpoint({ id: user.id, name: user.name });
    if (!result.written) return { ok: false as const, message: result.reason };
    const cp = result.checkpoint;
    return {
      message: `Checkpoint signed: event ${cp.seq}, hash ${cp.hash.slice(0, 16)}…, key ${cp.keyId}, kept in ${result.where}${result.emailedTo ? `; a copy was e-mailed to ${result.emailedTo}` : ""}.`,
    };
  },
});
