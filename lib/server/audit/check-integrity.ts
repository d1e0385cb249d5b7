import "server-only";
import { inArray, sql } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { auditEvents } from "@/db/schema";
import { verifyAuditChain, type ChainVerification } from "@/lib/audit";
import { compareWithCheckpoints, type SignedCheckpoint } from "@/lib/audit/checkpoint";
import type { ChainBreak } from "@/lib/audit/verify";
import { checkSignatures, type SignatureFinding } from "./check-signatures";
import { loadCheckpoints } from "./load-checkpoints";
import { getSigningKey, type SigningKey } from "./signing-key";

export interface CheckpointComparison {
  count: number;
  newest: SignedCheckpoint | null;
  breaks: ChainBreak[];
  unreadable: string[];
  /** Events after the newest checkpoint: the chain vouches for them, no checkpoint does yet. */
  uncovered: number;
  key: Pick<SigningKey, "keyId" | "source" | "path"> | null;
  /** Why the checkpoints could not be checked (no key configured), or null. */
  keyProblem: string | null;
}

export interface IntegrityReport {
  ok: boolean;
  chain: ChainVerification;
  checkpoints: CheckpointComparison;
  signatures: { checked: number; findings: SignatureFinding[] };
  /** Every flaw found, one sentence each, chain first. */
  findings: string[];
}

/** The chain as stored against every signed checkpoint in the evidence store (or only the newest: see loadCheckpoints). */
export async function compareChainWithCheckpoints(
  db: Executor,
  options: { newestOnly?: boolean } = {},
): Promise<CheckpointComparison> {
  let key: SigningKey | null = null;
  let keyProblem: string | null = null;
  try {
    key = getSigningKey();
  } catch (error) {
    keyProblem = error instanceof Error ? error.message : String(error);
  }
  const { checkpoints, unreadable } = await loadCheckpoints(options);
  const seqs = [...new Set(checkpoints.map((c) => c.seq))];
  const stored = new Map<number, string>();
  for (let i = 0; i < seqs.length; i += 500) {
    const rows = await db
      .select({ seq: auditEvents.seq, hash: auditEvents.hash })
      .from(auditEvents)
      .where(inArray(auditEvents.seq, seqs.slice(i, i + 500)));
    for (const r of rows) stored.set(r.seq, r.hash);
  }
  const last = await db.get<{ seq: number | null }>(sql`SELECT max(seq) AS seq FROM audit_events`);
  const lastSeq = last?.seq ?? 0;
  const newest = checkpoints.at(-1) ?? null;
  return {
    count: checkpoints.length,
    newest,
    breaks: key
      ? compareWithCheckpoints(checkpoints, (seq) => stored.get(seq), lastSeq, key.publicKey)
      : [],
    unreadable,
    uncovered: Math.max(0, lastSeq - (newest?.seq ?? 0)),
    key: key && { keyId: key.keyId, source: key.source, path: key.path },
    keyProblem,
  };
}

/** Every checkpoint flaw as one sentence each. */
export function checkpointFindings(c: CheckpointComparison): string[] {
  return [
    ...(c.keyProblem
      ? [`Checkpoint: ${c.keyProblem} The ${c.count} stored checkpoints could not be checked.`]
      : []),
    ...c.breaks.map((b) => `Checkpoint: ${b.reason}.`),
    ...c.unreadable.map(
      (n) => `Checkpoint: the file ${n} in the evidence store is not a readable checkpoint.`,
    ),
  ];
}

/**
 * The whole integrity check: the hash chain link by link (every break), the chain
 * against every signed checkpoint in the evidence store, and every signature
 * against its signing event and the record as stored.
 */
export async function checkIntegrity(db: Executor = getDb()): Promise<IntegrityReport> {
  const [chain, checkpoints] = await Promise.all([
    verifyAuditChain(db),
    compareChainWithCheckpoints(db),
  ]);
  const signatures = await checkSignatures(db);
  const findings = [
    ...chain.breaks.map((b) => `Chain: ${b.reason}.`),
    ...checkpointFindings(checkpoints),
    ...signatures.findings.map((f) => `Signature: ${f.message}`),
  ];
  return { ok: findings.length === 0, chain, checkpoints, signatures, findings };
}
