/**
 * npm run restore -- <backup folder> [--replace]
 * Checks every hash in the backup's manifest, then restores its evidence files
 * into the configured store and its database to DATABASE_URL. Stop the server first.
 */
import { parseArgs } from "node:util";
import { z } from "zod";
import { BackupError } from "@/lib/backup/backup";
import { restore } from "@/lib/backup/restore";
import { env } from "@/lib/env";
import { getStore } from "@/lib/storage";

const argsSchema = z.object({
  folder: z
    .string({ error: "Name the backup folder to restore." })
    .min(1, "Name the backup folder to restore."),
  replace: z.boolean().default(false),
});

let parsed;
try {
  const { values, positionals } = parseArgs({
    options: { replace: { type: "boolean" } },
    allowPositionals: true,
  });
  if (positionals.length > 1) throw new Error("Give one backup folder.");
  parsed = argsSchema.parse({ folder: positionals[0], replace: values.replace });
} catch (error) {
  console.error(
    `${error instanceof z.ZodError ? error.issues.map((i) => i.message).join("; ") : (error as Error).message}\nUsage: npm run restore -- <backup folder> [--replace]`,
  );
  process.exit(2);
}

const { DATABASE_URL } = env();
try {
  const store = getStore();
  const result = await restore({
    folder: parsed.folder,
    databaseUrl: DATABASE_URL,
    store,
    replace: parsed.replace,
  });
  console.log(
    `Restored the backup of ${result.manifest.createdAt} to ${result.databasePath} (${result.manifest.database.auditEvents} audit events, chain verified).`,
  );
  console.log(
    `  ${result.manifest.uploads.length} evidence files checked and present in the ${store.driver} store; took ${Math.round(result.ms)} ms.`,
  );
  if (result.keptAs)
    console.log(
      `  The database it replaced is kept as ${result.keptAs}; delete it once the restore is checked.`,
    );
} catch (error) {
  console.error(error instanceof BackupError ? `Restore refused: ${error.message}` : error);
  process.exit(1);
}
