import { env } from "@/lib/env";
import { localStore } from "./local";
import { s3Store } from "./s3";
import type { BlobStore } from "./types";

export { localStore } from "./local";
export { s3Store } from "./s3";
export { blobKey, type BlobStore } from "./types";

let store: BlobStore | undefined;

/** The configured store (STORAGE_DRIVER), made once per process. */
export function getStore(): BlobStore {
  if (!store) {
    const e = env();
    store =
      e.STORAGE_DRIVER === "s3"
        ? s3Store({
            bucket: e.S3_BUCKET!,
            endpoint: e.S3_ENDPOINT,
            region: e.S3_REGION,
            accessKeyId: e.S3_ACCESS_KEY_ID,
            secretAccessKey: e.S3_SECRET_ACCESS_KEY,
            forcePathStyle: e.S3_FORCE_PATH_STYLE,
          })
        : localStore(e.UPLOAD_DIR);
  }
  return store;
}

/** Tests point the process at a store of their own. */
export function setStore(next: BlobStore | undefined) {
  store = next;
}
