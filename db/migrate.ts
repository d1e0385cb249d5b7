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
  if (client.protocol === "file" && (await client.execute("PRAGMA journal_mode")).rows[0]?.journal_mode !== "memory") {
    await client.execute("PRAGMA journal_mode = WAL");
  }
  await migrate(db, { migrationsFolder: MIGRATIONS_FOLDER });
}
