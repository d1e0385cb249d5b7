import { asc, gte, sql } from "drizzle-orm";
import { auditEvents } from "@/db/schema";
import type { Executor } from "@/db/client";
import { Worker } from "node:worker_threads";
import { chainHash, GENESIS_HASH } from "./hash";

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

// A thousand rows a page: the driver hands larger results over more slowly per byte.
const PAGE = 1000;

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
 * columns, which tests/unit/audit-chain.test.ts checks), as bytes, on a second
 * thread while this one reads the next page. A page that is short or shows any
 * flaw is re-read row by row, which names each broken link.
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
  let hasher: PageHasher | null = null;
  try {
    let text = await chainTextPage(db, from, page);
    for (;;) {
      if (text.rows === page && text.text) {
        // A whole page is hashed on another thread while this one reads the next page: the
        // driver reads on this thread, so reading and hashing overlap only this way.
        hasher ??= new PageHasher();
        const checked = hasher.check(text.text, from, prev);
        const ahead = await chainTextPage(db, from + page, page);
        const last = await checked;
        if (last !== null) {
          prev = last;
          from += page;
          count += page;
          text = ahead;
          continue;
        }
      }
      // A short page (the end) or one that showed a flaw: row by row, naming each broken link.
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
          breaks.push({
            seq: row.seq,
            reason: `event ${row.seq} was altered after it was written`,
          });
        }
        prev = row.hash;
        from = row.seq + 1;
        count += 1;
      }
      if (rows.length < page) break;
      text = await chainTextPage(db, from, page);
    }
  } finally {
    await hasher?.close();
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
 * simply fails the page check and is re-read row by row. The page comes as
 * bytes: the hash covers the UTF-8 bytes, and a blob crosses from the driver
 * without being decoded into a string (1.7 against 2.4 s a million rows).
 */
async function chainTextPage(
  db: Executor,
  from: number,
  size: number,
): Promise<{ rows: number; text: ArrayBuffer | null }> {
  const row = await db.get<{ rows: number; text: ArrayBuffer | null }>(sql`
    SELECT count(*) AS rows, CAST(group_concat(hash || json_array(prev_hash, seq, at, actor_id, actor_name, action, record_type, record_id, old_value, new_value, reason), char(10)) AS BLOB) AS text
    FROM audit_events WHERE seq >= ${from} AND seq < ${from + size}`);
  return { rows: Number(row?.rows ?? 0), text: row?.text ?? null };
}

// The page check, run on the hashing thread: the last hash of a page whose every line links and
// hashes true, or null at the first doubt. Lines end in a newline byte, which JSON text and hex
// never hold. Plain JavaScript, so the thread needs no build step.
const PAGE_CHECK = `
const { parentPort } = require("node:worker_threads");
const crypto = require("node:crypto");
const sha256Hex = crypto.hash
  ? (bytes) => crypto.hash("sha256", bytes, "hex")
  : (bytes) => crypto.createHash("sha256").update(bytes).digest("hex");
parentPort.on("message", ({ id, text, from, prev }) => {
  const bytes = Buffer.from(text);
  for (let start = 0, i = 0; start < bytes.length; i++) {
    let end = bytes.indexOf(10, start);
    if (end < 0) end = bytes.length;
    const hash = bytes.toString("latin1", start, start + 64);
    const link = '["' + prev + '",' + (from + i) + ",";
    if (
      bytes.toString("latin1", start + 64, start + 64 + link.length) !== link ||
      sha256Hex(bytes.subarray(start + 64, end)) !== hash
    ) {
      parentPort.postMessage({ id, last: null });
      return;
    }
    prev = hash;
    start = end + 1;
  }
  parentPort.postMessage({ id, last: prev });
});
`;

/** One thread that checks pages of the chain in the order they are given. */
class PageHasher {
  private worker = new Worker(PAGE_CHECK, { eval: true });
  private waiting = new Map<
    number,
    { resolve: (last: string | null) => void; reject: (e: Error) => void }
  >();
  private nextId = 1;

  constructor() {
    this.worker.on("message", ({ id, last }: { id: number; last: string | null }) => {
      this.waiting.get(id)?.resolve(last);
      this.waiting.delete(id);
    });
    this.worker.on("error", (error) => {
      for (const w of this.waiting.values()) w.reject(error);
      this.waiting.clear();
    });
  }

  /** Checks a page's bytes, which move to the thread (the caller no longer holds them). */
  check(text: ArrayBuffer, from: number, prev: string): Promise<string | null> {
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.waiting.set(id, { resolve, reject });
      try {
        this.worker.postMessage({ id, text, from, prev }, [text]);
      } catch {
        this.worker.postMessage({ id, text, from, prev }); // a driver's buffer that cannot move is copied
      }
    });
  }

  close() {
    return this.worker.terminate();
  }
}
