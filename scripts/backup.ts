/**
 * npm run backup -- [--out <folder>]
 * A consistent copy of the database and of every evidence file it refers to,
 * taken while the server runs, into <folder>/washproof-<UTC time>/ with a manifest.
 */
import { parseArgs } from "node:util";
import { z } from "zod";
import { backup, BackupError } from "@/lib/backup/backup";
import { env } from "@/lib/env";
import { getStore } from "@/lib/storage";

const argsSchema = z
  .object({ out: z.string().min(1, "--out needs a folder").default("./backups") })
  .strict();

let parsed;
try {
  const { values } = parseArgs({ options: { out: { type: "string" } }, allowPositionals: false });
  parsed = argsSchema.parse(values);
} catch (error) {
  console.error(
    `${error instanceof z.ZodError ? error.issues.map((i) => i.message).join("; ") : (error as Error).message}\nUsage: npm run backup -- [--out <folder>]`,
  );
  process.exit(2);
}

const { DATABASE_URL, DATABASE_AUTH_TOKEN } = env();
try {
  const { dir, manifest, ms } = await backup({
    databaseUrl: DATABASE_URL,
    authToken: DATABASE_AUTH_TOKEN,
    store: getStore(),
    outDir: parsed.out,
  });
  const uploadBytes = manifest.uploads.reduce((sum, u) => sum + u.sizeBytes, 0);
  console.log(`Backup written to ${dir}`);
  console.log(
    `  database ${(manifest.database.sizeBytes / 1024).toFixed(0)} KiB, ${manifest.database.auditEvents} audit events, SHA-256 ${manifest.database.sha256}`,
  );
  console.log(
    `  ${manifest.uploads.length} evidence files, ${(uploadBytes / 1024).toFixed(0)} KiB, in ${Math.round(ms)} ms`,
  );
} catch (error) {
  console.error(error instanceof BackupError ? `Backup failed: ${error.message}` : error);
  process.exit(1);
}
