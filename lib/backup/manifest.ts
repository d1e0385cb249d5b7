import { createHash } from "node:crypto";
import { createReadStream } from "node:fs";
import { z } from "zod";

/** What a backup folder holds, written last: a folder without it is incomplete. */
export const manifestSchema = z.object({
  format: z.literal(1),
  createdAt: z.string(),
  database: z.object({
    file: z.literal("washproof.db"),
    sha256: z.string().regex(/^[0-9a-f]{64}$/),
    sizeBytes: z.number().int().nonnegative(),
    auditEvents: z.number().int().nonnegative(),
    auditHead: z.string(),
  }),
  /** Every evidence file the database refers to, by content address; stored under uploads/ab/cd/<sha256>. */
  uploads: z.array(
    z.object({
      sha256: z.string().regex(/^[0-9a-f]{64}$/),
      sizeBytes: z.number().int().nonnegative(),
    }),
  ),
});
export type Manifest = z.infer<typeof manifestSchema>;

export const MANIFEST_FILE = "manifest.json";
export const DATABASE_FILE = "washproof.db";
export const UPLOADS_FOLDER = "uploads";

/** SHA-256 of a file, streamed so a large database is not read into memory at once. */
export function sha256File(path: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const hash = createHash("sha256");
    createReadStream(path)
      .on("data", (chunk) => hash.update(chunk))
      .on("error", reject)
      .on("end", () => resolve(hash.digest("hex")));
  });
}

/** The path of a file: URL, or null for a libSQL server. */
export function filePathOf(databaseUrl: string): string | null {
  if (!databaseUrl.startsWith("file:")) return null;
  return databaseUrl.slice("file:".length).replace(/^\/\/(?=\/)/, "");
}
