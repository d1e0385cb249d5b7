import { mkdirSync, renameSync, rmSync, statSync, writeFileSync } from "node:fs";
import { join, resolve } from "node:path";
import { sql } from "drizzle-orm";
import { openDatabase } from "@/db/client";
import { evidenceFiles } from "@/db/schema";
import { sha256Hex, verifyAuditChain } from "@/lib/audit";
import { localStore, type BlobStore } from "@/lib/storage";
import {
  DATABASE_FILE,
  filePathOf,
  MANIFEST_FILE,
  sha256File,
  UPLOADS_FOLDER,
  type Manifest,
} from "./manifest";
import { fileStamp } from "@/lib/format/date";

export class BackupError extends Error {}

/** 2026-05-04T08:00:00.000Z → 20260504T080000Z: sorts by time and is safe in a folder name. */

/**
 * A consistent online copy: VACUUM INTO takes one read snapshot of the live
 * database (writers carry on), then every evidence file that snapshot refers to
 * is copied through the store, re-hashed on the way. The folder is filled under
 * a temporary name and renamed once the manifest is written.
 */
export async function backup(input: {
  databaseUrl: string;
  authToken?: string;
  store: BlobStore;
  outDir: string;
  now?: Date;
}) {
  if (!filePathOf(input.databaseUrl)) {
    throw new BackupError(
      "DATABASE_URL names a libSQL server: back it up with the server's own snapshots. This command copies a database file.",
    );
  }
  const started = performance.now();
  const createdAt = (input.now ?? new Date()).toISOString();
  const finalDir = resolve(input.outDir, `washproof-${fileStamp(new Date(createdAt))}`);
  const workDir = `${finalDir}.partial`;
  rmSync(workDir, { recursive: true, force: true });
  mkdirSync(workDir, { recursive: true });
  try {
    const dbPath = join(workDir, DATABASE_FILE);
    const source = openDatabase(input.databaseUrl, input.authToken);
    try {
      await source.client.execute({ sql: "VACUUM INTO ?", args: [dbPath] });
    } finally {
      source.client.close();
    }

    const copy = openDatabase(`file:${dbPath}`);
    let manifest: Manifest;
    try {
      const integrity = (await copy.client.execute("PRAGMA integrity_check")).rows[0]
        ?.integrity_check;
      if (integrity !== "ok")
        throw new BackupError(`The copy failed SQLite's integrity check: ${integrity}`);
      const chain = await verifyAuditChain(copy.db);
      if (!chain.ok)
        throw new BackupError(
          `The audit chain is broken at event ${chain.brokenAt} (${chain.reason}); fix that before backing up.`,
        );
      const files = await copy.db
        .select({
          sha256: evidenceFiles.sha256,
          sizeBytes: sql<number>`max(${evidenceFiles.sizeBytes})`,
        })
        .from(evidenceFiles)
        .groupBy(evidenceFiles.sha256);
      const target = localStore(join(workDir, UPLOADS_FOLDER));
      for (const file of files) {
        const bytes = await input.store.get(file.sha256);
        if (!bytes)
          throw new BackupError(
            `Evidence file ${file.sha256} is in the database but not in the ${input.store.driver} store.`,
          );
        if (sha256Hex(bytes) !== file.sha256)
          throw new BackupError(
            `Evidence file ${file.sha256} in the ${input.store.driver} store no longer matches its hash.`,
          );
        await target.put(file.sha256, bytes);
      }
      manifest = {
        format: 1,
        createdAt,
        database: {
          file: DATABASE_FILE,
          sha256: "",
          sizeBytes: 0,
          auditEvents: chain.events,
          auditHead: chain.lastHash,
        },
        uploads: files.map((f) => ({ sha256: f.sha256, sizeBytes: Number(f.sizeBytes) })),
      };
    } finally {
      copy.client.close();
    }
    manifest.database.sha256 = await sha256File(dbPath);
    manifest.database.sizeBytes = statSync(dbPath).size;
    writeFileSync(join(workDir, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`);
    renameSync(workDir, finalDir);
    return { dir: finalDir, manifest, ms: performance.now() - started };
  } catch (error) {
    rmSync(workDir, { recursive: true, force: true });
    throw error;
  }
}
