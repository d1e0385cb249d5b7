import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { openDatabase, setProcessDatabase } from "@/db/client";
import { migrateDatabase } from "@/db/migrate";
import { localCheckpointStore, setCheckpointStore } from "@/lib/storage/checkpoints";

/** A fresh, migrated SQLite file in a temporary folder, made the process database, with its own checkpoint folder. */
export async function createTestDatabase() {
  const dir = mkdtempSync(join(tmpdir(), "washproof-test-"));
  const url = `file:${join(dir, "test.db")}`;
  const { db, client } = openDatabase(url);
  await migrateDatabase(db, client);
  setProcessDatabase(db, client);
  // Checkpoints belong to one database: a test's never mix with the demo's or another test's.
  setCheckpointStore(localCheckpointStore(dir));
  return {
    db,
    client,
    url,
    cleanup() {
      client.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
