import "server-only";
import { eq, inArray } from "drizzle-orm";
import type { Executor } from "@/db/client";
import {
  auditEvents,
  documentVersions,
  nonconformances,
  signatures,
  testRuns,
  type Signature,
} from "@/db/schema";
import { hashContent } from "@/lib/server/documents/shared";
import { computeStoredOutcome } from "@/lib/server/evidence/refresh-outcome";
import { runContent } from "@/lib/server/evidence/run-content";
import { ncHash } from "@/lib/server/nonconformances/shared";
import { formatDate } from "@/lib/format/date";

export interface SignatureFinding {
  signatureId: string;
  recordType: string;
  recordId: string;
  message: string;
}

/**
 * Re-checks every signature against two independent witnesses: its signing event
 * in the audit trail (which the chain and the checkpoints protect) and the record
 * as stored now, re-hashed the way the signing step hashed it. A signature row
 * whose hash was "updated" to fit an altered record disagrees with its event; a
 * record altered under an untouched signature no longer hashes to it.
 *
 * Re-hashed here: test runs (which change only through a new revision) and
 * document versions once approved. Change-request signatures are compared with
 * their events only: their content is rebuilt from many tables and may move on
 * legitimately between revisions.
 */
export async function checkSignatures(
  db: Executor,
): Promise<{ checked: number; findings: SignatureFinding[] }> {
  const rows = await db.select().from(signatures);
  const events = await db
    .select({ recordId: auditEvents.recordId, newValue: auditEvents.newValue })
    .from(auditEvents)
    .where(eq(auditEvents.action, "signature.applied"));
  const signedHash = new Map<string, string | undefined>();
  for (const e of events) {
    try {
      signedHash.set(
        e.recordId,
        (JSON.parse(e.newValue ?? "null") as { contentHash?: string } | null)?.contentHash,
      );
    } catch {
      signedHash.set(e.recordId, undefined);
    }
  }
  const findings: SignatureFinding[] = [];
  const name = (s: Signature) =>
    `the "${s.meaning}" signature of ${s.printedName} (${formatDate(s.signedAt)})`;
  const add = (s: Signature, message: string) =>
    findings.push({ signatureId: s.id, recordType: s.recordType, recordId: s.recordId, message });

  for (const s of rows) {
    const atSigning = signedHash.get(s.id);
    if (!signedHash.has(s.id))
      add(
        s,
        `${name(s)} on ${s.recordType} ${s.recordId} has no signing event in the audit trail.`,
      );
    else if (atSigning !== s.contentHash)
      add(
        s,
        `${name(s)} on ${s.recordType} ${s.recordId} now binds to ${s.contentHash.slice(0, 12)}…, but was signed on ${String(atSigning).slice(0, 12)}…: the signature was altered after signing.`,
      );
  }

  const byRecord = (type: string) => {
    const map = new Map<string, Signature[]>();
    for (const s of rows.filter((r) => r.recordType === type))
      map.set(s.recordId, [...(map.get(s.recordId) ?? []), s]);
    return map;
  };
  // What the signer saw: the hash in the signing event where there is one.
  const original = (s: Signature) => signedHash.get(s.id) ?? s.contentHash;

  const runSigs = byRecord("test_run");
  for (let i = 0, ids = [...runSigs.keys()]; i < ids.length; i += 200) {
    const runs = await db
      .select()
      .from(testRuns)
      .where(inArray(testRuns.id, ids.slice(i, i + 200)));
    for (const run of runs) {
      const { hash } = await runContent(db, run);
      const sigs = runSigs.get(run.id)!;
      for (const s of sigs) {
        if (original(s) !== hash)
          add(
            s,
            `Test run ${run.number} was changed after ${name(s)}: its data or files no longer hash to what was signed.`,
          );
      }
      const computed = (await computeStoredOutcome(db, run)).outcome;
      if (run.outcome !== null && run.outcome !== computed) {
        add(
          sigs[0],
          `Test run ${run.number} shows the outcome "${run.outcome}", but its stored data give "${computed}".`,
        );
      }
    }
  }

  const docSigs = byRecord("document_version");
  for (let i = 0, ids = [...docSigs.keys()]; i < ids.length; i += 200) {
    const versions = await db
      .select()
      .from(documentVersions)
      .where(inArray(documentVersions.id, ids.slice(i, i + 200)));
    for (const v of versions) {
      if (v.status === "draft" || v.status === "in_review") continue;
      const hash = hashContent(v.content);
      const approvals = docSigs.get(v.id)!.filter((s) => s.meaning === "approved");
      // Earlier review rounds signed earlier text; the approval that released the version must match what is stored.
      if (approvals.length > 0 && !approvals.some((s) => original(s) === hash)) {
        add(
          approvals.at(-1)!,
          `Document version ${v.version} (${v.status}) was changed after its approval: its text no longer hashes to what was approved.`,
        );
      }
    }
  }
  // A closed nonconformance still hashes to what its closure approval signed.
  const ncSigs = byRecord("nonconformance");
  for (let i = 0, ids = [...ncSigs.keys()]; i < ids.length; i += 200) {
    const ncs = await db
      .select()
      .from(nonconformances)
      .where(inArray(nonconformances.id, ids.slice(i, i + 200)));
    for (const nc of ncs) {
      if (nc.status !== "closed") continue;
      const hash = await ncHash(db, nc);
      const approvals = ncSigs.get(nc.id)!.filter((s) => s.meaning === "approved");
      if (approvals.length > 0 && !approvals.some((s) => original(s) === hash))
        add(
          approvals.at(-1)!,
          `Nonconformance ${nc.number} was changed after its closure was approved: it no longer hashes to what was signed.`,
        );
    }
  }
  return { checked: rows.length, findings };
}
