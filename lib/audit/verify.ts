import { asc, gt, sql } from "drizzle-orm";
import { auditEvents } from "@/db/schema";
import type { Executor } from "@/db/client";
import { chainHash, GENESIS_HASH, sha256Hex } from "./hash";

export type ChainVerification =
  | { ok: true; events: number; lastHash: string }
  | { ok: false; events: number; brokenAt: number; reason: string };

const PAGE = 5000;

/**
 * Re-computes every link of the audit chain in order. Reports the first broken
 * link: an altered row (hash mismatch), a removed or inserted row (sequence gap
 * or a previous-hash mismatch), or removed rows at the end (the autoincrement
 * counter is ahead of the last row).
 *
 * Reading a million rows through the driver costs far more than hashing them,
 * so whole pages are first checked on the text SQLite builds itself
 * (`json_array` writes exactly the bytes `JSON.stringify` does for these
 * columns, which tests/unit/audit-chain.test.ts checks). A page that is short
 * or shows any flaw is re-read row by row, which names the broken link.
 */
export async function verifyAuditChain(db: Executor, options: { page?: number } = {}): Promise<ChainVerification> {
  const page = options.page ?? PAGE;
  let prev = GENESIS_HASH;
  let from = 1;
  for (;;) {
    const lines = await chainTextPage(db, from, page);
    const last = lines.length === page ? pageHolds(lines, from, prev) : null;
    if (last === null) return verifyRows(db, { from, prev, page });
    prev = last;
    from += page;
  }
}

/**
 * Rows with seq in [from, from + size) as "<stored hash><text its hash covers>",
 * one per line, in the order of the table's rowid scan; a page out of order
 * simply fails pageHolds and is re-read row by row.
 */
async function chainTextPage(db: Executor, from: number, size: number): Promise<string[]> {
  const row = await db.get<{ text: string | null }>(sql`
    SELECT group_concat(hash || json_array(prev_hash, seq, at, actor_id, actor_name, action, record_type, record_id, old_value, new_value, reason), char(10)) AS text
    FROM audit_events WHERE seq >= ${from} AND seq < ${from + size}`);
  return row?.text ? row.text.split("\n") : [];
}

/** The last hash of a page whose every line links and hashes true, or null at the first doubt. */
function pageHolds(lines: string[], from: number, prev: string): string | null {
  for (const [i, line] of lines.entries()) {
    const hash = line.slice(0, 64);
    const text = line.slice(64);
    if (!text.startsWith(`["${prev}",${from + i},`) || sha256Hex(text) !== hash) return null;
    prev = hash;
  }
  return prev;
}

/** Row by row from `from`, given the hash the row before it must carry. */
async function verifyRows(db: Executor, start: { from: number; prev: string; page: number }): Promise<ChainVerification> {
  let expectedPrev = start.prev;
  let expectedSeq = start.from;
  let count = start.from - 1;
  for (;;) {
    const rows = await db
      .select()
      .from(auditEvents)
      .where(gt(auditEvents.seq, expectedSeq - 1))
      .orderBy(asc(auditEvents.seq))
      .limit(start.page);
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
    if (rows.length < start.page) break;
  }
  const counter = await db.get<{ seq: number } | undefined>(
    sql`SELECT seq FROM sqlite_sequence WHERE name = 'audit_events'`,
  );
  if (counter && counter.seq > count) {
    return { ok: false, events: count, brokenAt: count + 1, reason: `events ${count + 1}–${counter.seq} were removed` };
  }
  return { ok: true, events: count, lastHash: expectedPrev };
}
