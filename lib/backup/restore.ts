import {
  closeSync,
  copyFileSync,
  existsSync,
  fsyncSync,
  mkdirSync,
  openSync,
  readFileSync,
  renameSync,
  statSync,
} from "node:fs";
import { basename, dirname, join, resolve } from "node:path";
import { openDatabase } from "@/db/client";
import { sha256Hex, verifyAuditChain } from "@/lib/audit";
import { blobKey, type BlobStore } from "@/lib/storage";
import { BackupError } from "./backup";
import {
  filePathOf,
  MANIFEST_FILE,
  manifestSchema,
  sha256File,
  UPLOADS_FOLDER,
  type Manifest,
} from "./manifest";

/** Reads a backup folder and checks every hash in its manifest; nothing is touched if one fails. */
export async function checkBackup(folder: string): Promise<{ manifest: Manifest; dbPath: string }> {
  const dir = resolve(folder);
  const manifestPath = join(dir, MANIFEST_FILE);
  if (!existsSync(manifestPath))
    throw new BackupError(`${dir} has no ${MANIFEST_FILE}: it is not a finished backup.`);
  let raw: unknown;
  try {
    raw = JSON.parse(readFileSync(manifestPath, "utf8"));
  } catch {
    throw new BackupError(`${manifestPath} is not valid JSON.`);
  }
  const parsed = manifestSchema.safeParse(raw);
  if (!parsed.success)
    throw new BackupError(
      `${manifestPath} is not a Washproof backup manifest: ${parsed.error.issues[0]?.message}`,
    );
  const manifest = parsed.data;
  const dbPath = join(dir, manifest.database.file);
  if (!existsSync(dbPath))
    throw new BackupError(`The backup's database file ${dbPath} is missing.`);
  if ((await sha256File(dbPath)) !== manifest.database.sha256)
    throw new BackupError(
      `The backup's database file does not match the SHA-256 in its manifest: it was changed or damaged.`,
    );
  for (const upload of manifest.uploads) {
    const path = join(dir, UPLOADS_FOLDER, blobKey(upload.sha256));
    if (!existsSync(path))
      throw new BackupError(
        `Evidence file ${upload.sha256} is listed in the manifest but missing from the backup.`,
      );
    const bytes = readFileSync(path);
    if (bytes.byteLength !== upload.sizeBytes || sha256Hex(bytes) !== upload.sha256)
      throw new BackupError(
        `Evidence file ${upload.sha256} in the backup does not match its hash: it was changed or damaged.`,
      );
  }
  const copy = openDatabase(`file:${dbPath}`);
  try {
    const chain = await verifyAuditChain(copy.db);
    if (
      !chain.ok ||
      chain.events !== manifest.database.auditEvents ||
      chain.lastHash !== manifest.database.auditHead
    ) {
      throw new BackupError("The backup's audit chain does not verify against its manifest.");
    }
  } finally {
    copy.client.close();
  }
  return { manifest, dbPath };
}

/** SQLite's side files: a stale WAL beside a replaced database would be replayed into it. */
const SIDE_FILES = ["", "-wal", "-shm", "-journal"];

/**
 * Brings a checked backup back: the evidence files first (content-addressed, so
 * adding them never harms what is there), then the database, copied beside the
 * target and renamed over it. A database already there is kept, renamed aside
 * with its side files, and replaced only with `replace: true`.
 */
export async function restore(input: {
  folder: string;
  databaseUrl: string;
  store: BlobStore;
  replace: boolean;
  now?: Date;
}) {
  const started = performance.now();
  const target = filePathOf(input.databaseUrl);
  if (!target)
    throw new BackupError(
      "DATABASE_URL names a libSQL server: restore it with the server's own tools. This command restores a database file.",
    );
  const targetPath = resolve(target);
  const exists = existsSync(targetPath);
  if (exists && !input.replace) {
    throw new BackupError(
      `${targetPath} exists. Stop the server, then run again with --replace to replace it (the current file is kept beside it).`,
    );
  }
  const { manifest, dbPath } = await checkBackup(input.folder);

  for (const upload of manifest.uploads) {
    await input.store.put(
      upload.sha256,
      readFileSync(join(resolve(input.folder), UPLOADS_FOLDER, blobKey(upload.sha256))),
    );
  }

  const stamp = (input.now ?? new Date()).toISOString().replace(/[-:.]/g, "");
  mkdirSync(dirname(targetPath), { recursive: true });
  const temp = join(dirname(targetPath), `.${basename(targetPath)}.restore-${stamp}`);
  copyFileSync(dbPath, temp);
  const fd = openSync(temp, "r+");
  fsyncSync(fd);
  closeSync(fd);
  if ((await sha256File(temp)) !== manifest.database.sha256)
    throw new BackupError("The copied database does not match the backup; nothing was replaced.");
  const keptAs = exists ? `${targetPath}.replaced-${stamp}` : null;
  if (keptAs)
    for (const side of SIDE_FILES)
      if (existsSync(targetPath + side)) renameSync(targetPath + side, keptAs + side);
  renameSync(temp, targetPath);
  return {
    manifest,
    databasePath: targetPath,
    keptAs,
    sizeBytes: statSync(targetPath).size,
    ms: performance.now() - started,
  };
}
