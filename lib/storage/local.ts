import { randomUUID } from "node:crypto";
import { mkdir, readFile, rename, stat, writeFile } from "node:fs/promises";
import { dirname, join, resolve } from "node:path";
import { blobKey, type BlobStore } from "./types";

/** Files under a folder outside public/, written to a temporary name and renamed, so a reader never sees half a file. */
export function localStore(root: string): BlobStore {
  const base = resolve(root);
  const pathOf = (sha256: string) => join(base, blobKey(sha256));
  async function has(sha256: string) {
    try {
      await stat(pathOf(sha256));
      return true;
    } catch {
      return false;
    }
  }
  return {
    driver: "local",
    has,
    async put(sha256, bytes) {
      const path = pathOf(sha256);
      if (await has(sha256)) return { created: false };
      await mkdir(dirname(path), { recursive: true });
      const temp = `${path}.${randomUUID()}.part`;
      await writeFile(temp, bytes, { flag: "wx", mode: 0o640 });
      await rename(temp, path);
      return { created: true };
    },
    async get(sha256) {
      try {
        return new Uint8Array(await readFile(pathOf(sha256)));
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === "ENOENT") return null;
        throw error;
      }
    },
  };
}
