import { asc, gt, sql } from "drizzle-orm";
import { auditEvents } from "@/db/schema";
import type { Executor } from "@/db/client";
import { chainHash, GENESIS_HASH } from "./hash";

export type ChainVerification =
  | { ok: true; events: number; lastHash: string }
  | { ok: false; events: number; brokenAt: number; reason: string };

const PAGE = 5000;

/**
 * Re-computes every link of the audit chain in order. Reports the first broken
 * link: an altered row (hash mismatch), a removed or inserted row (sequence gap
 * or a previous-hash mismatch), or removed rows at the end (the autoincrement
 * counter is ahead of the last row).
 */
export async function verifyAuditChain(db: Executor): Promise<ChainVerification> {
  let expectedPrev = GENESIS_HASH;
  let expectedSeq = 1;
  let count = 0;
  for (;;) {
    const rows = await db
      .select()
      .from(auditEvents)
      .where(gt(auditEvents.seq, expectedSeq - 1))
      .orderBy(asc(auditEvents.seq))
      .limit(PAGE);
    for (const row of rows) {
      if (row.seq !== expectedSeq) {
        return { ok: false, events: count, brokenAt: expectedSeq, reason: `event ${expectedSeq} is missing` };
      }
      if (row.prevHash !== expectedPrev) {
        return { ok: false, events: count, brokenAt: row.seq, reason: `event ${row.seq} does not link to event ${row.seq - 1}` };
      }
      if (chainHash(row) !== row.hash) {
        return { ok: false, events: count, brokenAt: row.seq, reason: `event ${row.seq} was altered after it was written` };
      }
      expectedPrev = row.hash;
      expectedSeq += 1;
      count += 1;
    }
    if (rows.length < PAGE) break;
  }
  const counter = await db.get<{ seq: number } | undefined>(
    sql`SELECT seq FROM sqlite_sequence WHERE name = 'audit_events'`,
  );
  if (counter && counter.seq > count) {
    return { ok: false, events: count, brokenAt: count + 1, reason: `events ${count + 1}–${counter.seq} were removed` };
  }
  return { ok: true, events: count, lastHash: expectedPrev };
}
