import { asc, gte, sql } from "drizzle-orm";
import { auditEvents } from "@/db/schema";
import type { Executor } from "@/db/client";
import { chainHash, GENESIS_HASH, sha256Hex } from "./hash";

/** One flaw in the chain: the event where it shows and what is wrong there. */
export interface ChainBreak {
  seq: number;
  reason: string;
}

export type ChainVerification =
  | { ok: true; events: number; lastHash: string; breaks: [] }
  | {
      ok: false;
      events: number;
      lastHash: string;
      brokenAt: number;
      reason: string;
      breaks: ChainBreak[];
    };

const PAGE = 5000;

/**
 * Re-computes every link of the audit chain in order and reports every flaw, not
 * only the first, so one broken event never hides a later one: an altered row
 * (hash mismatch), a row that does not link to the one before, missing sequence
 * numbers, or removed rows at the end (the autoincrement counter is ahead of the
 * last row). After a flaw the walk re-anchors on the row as stored and goes on.
 *
 * Reading a million rows through the driver costs far more than hashing them,
 * so whole pages are first checked on the text SQLite builds itself
 * (`json_array` writes exactly the bytes `JSON.stringify` does for these
 * columns, which tests/unit/audit-chain.test.ts checks). A page that is short
 * or shows any flaw is re-read row by row, which names each broken link.
 */
export async function verifyAuditChain(
  db: Executor,
  options: { page?: number } = {},
): Promise<ChainVerification> {
  const page = options.page ?? PAGE;
  const breaks: ChainBreak[] = [];
  let prev = GENESIS_HASH;
  let from = 1;
  let count = 0;
  let next = chainTextPage(db, from, page);
  for (;;) {
    const lines = await next;
    // The following page is asked for before this one is hashed, so reading overlaps hashing
    // where the driver reads off the main thread (a libSQL server); it is dropped if this page fails.
    const ahead = lines.length === page ? chainTextPage(db, from + page, page) : null;
    const last = lines.length === page ? pageHolds(lines, from, prev) : null;
    if (last !== null) {
      prev = last;
      from += page;
      count += page;
      next = ahead!;
      continue;
    }
    ahead?.catch(() => undefined);
    const rows = await db
      .select()
      .from(auditEvents)
      .where(gte(auditEvents.seq, from))
      .orderBy(asc(auditEvents.seq))
      .limit(page);
    for (const row of rows) {
      if (row.seq !== from) {
        breaks.push({
          seq: from,
          reason:
            from === row.seq - 1
              ? `event ${from} is missing`
              : `events ${from}–${row.seq - 1} are missing`,
        });
      } else if (row.prevHash !== prev) {
        breaks.push({
          seq: row.seq,
          reason: `event ${row.seq} does not link to event ${row.seq - 1}`,
        });
      }
      if (chainHash(row) !== row.hash) {
        breaks.push({ seq: row.seq, reason: `event ${row.seq} was altered after it was written` });
      }
      prev = row.hash;
      from = row.seq + 1;
      count += 1;
    }
    if (rows.length < page) break;
    next = chainTextPage(db, from, page);
  }
  const counter = await db.get<{ seq: number } | undefined>(
    sql`SELECT seq FROM sqlite_sequence WHERE name = 'audit_events'`,
  );
  if (counter && counter.seq >= from) {
    breaks.push({
      seq: from,
      reason:
        from === counter.seq
          ? `event ${from} was removed from the end`
          : `events ${from}–${counter.seq} were removed from the end`,
    });
  }
  if (breaks.length === 0) return { ok: true, events: count, lastHash: prev, breaks: [] };
  return {
    ok: false,
    events: count,
    lastHash: prev,
    brokenAt: breaks[0].seq,
    reason: breaks[0].reason,
    breaks,
  };
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
