import { mkdirSync } from "node:fs";
import { dirname, resolve } from "node:path";
import { createClient, type Client } from "@libsql/client";
import { drizzle, type LibSQLDatabase } from "drizzle-orm/libsql";
import { env } from "@/lib/env";
import * as schema from "./schema";
import { withFastReads } from "./fast-reads";
import { serialiseWrites } from "./write-queue";

export type Database = LibSQLDatabase<typeof schema>;
/** A transaction or the database itself: services accept either so callers can compose them. */
export type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];
export type Executor = Database | Tx;

/** The file of a `file:` URL, or null for a server or an in-memory database. */
function filePath(url: string): string | null {
  if (!url.startsWith("file:")) return null;
  const path = url.slice("file:".length).replace(/^\/\/(?=\/)/, "");
  return path === ":memory:" ? null : path;
}

const BUSY_TIMEOUT_MS = 5000;

export function openDatabase(url: string, authToken?: string): { db: Database; client: Client } {
  const path = filePath(url);
  // libSQL creates the database file but not its folder.
  if (path) mkdirSync(dirname(resolve(path)), { recursive: true });
  // libSQL turns foreign keys on for every pooled connection; `timeout` is the busy timeout.
  const raw = createClient({ url, authToken, timeout: BUSY_TIMEOUT_MS, concurrency: 8 });
  // A server serialises its own writers; a file needs them queued in this process (see
  // write-queue.ts), and its plain reads are faster on statements kept prepared (fast-reads.ts).
  const client = path
    ? serialiseWrites(withFastReads(raw, path, BUSY_TIMEOUT_MS), BUSY_TIMEOUT_MS)
    : url.startsWith("file:")
      ? serialiseWrites(raw, BUSY_TIMEOUT_MS)
      : raw;
  return { db: drizzle(client, { schema }), client };
}

// Kept on globalThis: Next bundles instrumentation, route handlers and actions apart, each with
// its own copy of this module, and they must share one connection pool and one write queue.
const processWide = globalThis as typeof globalThis & {
  washproofDatabase?: { db: Database; client: Client };
};

/** The process-wide database, opened on first use so `next build` needs no data folder. */
export function getDb(): Database {
  if (!processWide.washproofDatabase) {
    const { DATABASE_URL, DATABASE_AUTH_TOKEN } = env();
    processWide.washproofDatabase = openDatabase(DATABASE_URL, DATABASE_AUTH_TOKEN);
  }
  return processWide.washproofDatabase.db;
}

/** Tests point the process at a temporary database. */
export function setProcessDatabase(db: Database, client: Client) {
  processWide.washproofDatabase = { db, client };
}
