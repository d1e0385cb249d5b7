import "server-only";
import { inArray, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { auditEvents } from "@/db/schema";
import { verifyAuditChain, type ChainVerification } from "@/lib/audit";
import { compareWithCheckpoints, type SignedCheckpoint } from "@/lib/audit/checkpoint";
import type { ChainBreak } from "@/lib/audit/verify";
import { checkSignatures, type SignatureFinding } from "./check-signatures";
import { loadCheckpoints } from "./load-checkpoints";
import { getSigningKey, type SigningKey } from "./signing-key";

export interface IntegrityReport {
  ok: boolean;
  chain: ChainVerification;
  checkpoints: { count: number; newest: SignedCheckpoint | null; breaks: ChainBreak[]; unreadable: string[] };
  /** Events after the newest checkpoint: the chain vouches for them, no checkpoint does yet. */
  uncovered: number;
  signatures: { checked: number; findings: SignatureFinding[] };
  key: Pick<SigningKey, "keyId" | "source" | "path">;
  /** Every flaw found, one sentence each, chain first. */
  findings: string[];
}

/**
 * The whole integrity check: the hash chain link by link (every break), the chain
 * against every signed checkpoint in the evidence store, and every signature
 * against its signing event and the record as stored.
 */
export async function checkIntegrity(db = getDb()): Promise<IntegrityReport> {
  const key = getSigningKey();
  const [chain, { checkpoints, unreadable }] = await Promise.all([verifyAuditChain(db), loadCheckpoints()]);
  const seqs = [...new Set(checkpoints.map((c) => c.seq))];
  const stored = new Map<number, string>();
  for (let i = 0; i < seqs.length; i += 500) {
    const rows = await db.select({ seq: auditEvents.seq, hash: auditEvents.hash }).from(auditEvents).where(inArray(auditEvents.seq, seqs.slice(i, i + 500)));
    for (const r of rows) stored.set(r.seq, r.hash);
  }
  const last = await db.get<{ seq: number | null }>(sql`SELECT max(seq) AS seq FROM audit_events`);
  const lastSeq = last?.seq ?? 0;
  const checkpointBreaks = compareWithCheckpoints(checkpoints, (seq) => stored.get(seq), lastSeq, key.publicKey);
  const signatures = await checkSignatures(db);
  const newest = checkpoints.at(-1) ?? null;
  const findings = [
    ...chain.breaks.map((b) => `Chain: ${b.reason}.`),
    ...checkpointBreaks.map((b) => `Checkpoint: ${b.reason}.`),
    ...unreadable.map((n) => `Checkpoint: the file ${n} in the evidence store is not a readable checkpoint.`),
    ...signatures.findings.map((f) => `Signature: ${f.message}`),
  ];
  return {
    ok: findings.length === 0,
    chain,
    checkpoints: { count: checkpoints.length, newest, breaks: checkpointBreaks, unreadable },
    uncovered: Math.max(0, lastSeq - (newest?.seq ?? 0)),
    signatures,
    key: { keyId: key.keyId, source: key.source, path: key.path },
    findings,
  };
}
