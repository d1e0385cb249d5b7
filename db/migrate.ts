import { migrate } from "drizzle-orm/libsql/migrator";
import { resolve } from "node:path";
import type { Client } from "@libsql/client";
import type { Database } from "./client";

export const MIGRATIONS_FOLDER = resolve(process.cwd(), "db/migrations");

/**
 * Applies committed migrations and the connection-independent pragmas (WAL persists in the file).
 * A libSQL server keeps its own journal, so the pragma is for database files only.
 */
export async function migrateDatabase(db: Database, client: Client) {
  if (
    client.protocol === "file" &&
    (await client.execute("PRAGMA journal_mode")).rows[0]?.journal_mode !== "memory"
  ) {
    await client.execute("PRAGMA journal_mode = WAL");
  }
  await migrate(db, { migrationsFolder: MIGRATIONS_FOLDER });
  await refreshPlannerStatistics(client);
}

/**
 * The planner picks indexes from ANALYZE's statistics; without them a new index can be ignored.
 * A database never analysed gets a full ANALYZE; one that has statistics only the cheap
 * `PRAGMA optimize`, which re-analyses the tables whose size has changed much.
 */
export async function refreshPlannerStatistics(client: Client) {
  const hasStats =
    (await client.execute("SELECT 1 FROM sqlite_schema WHERE name = 'sqlite_stat1'")).rows.length >
    0;
  const analysed =
    hasStats && (await client.execute("SELECT 1 FROM sqlite_stat1 LIMIT 1")).rows.length > 0;
  await client.execute(analysed ? "PRAGMA optimize" : "ANALYZE");
}
