/**
 * Where evidence bytes are kept, addressed by their SHA-256: the same bytes are
 * stored once however often they are uploaded, and a reader can check that what
 * comes back still hashes to its address.
 */
export interface BlobStore {
  readonly driver: "local" | "s3";
  /** Stores the bytes under their hash; `created` is false when they were already there. */
  put(sha256: string, bytes: Uint8Array): Promise<{ created: boolean }>;
  /** The stored bytes, or null when nothing is stored under that hash. */
  get(sha256: string): Promise<Uint8Array | null>;
  has(sha256: string): Promise<boolean>;
}

const SHA256 = /^[0-9a-f]{64}$/;

/** Refuses anything but a lower-case hex SHA-256, so an address can never name a path. */
export function assertSha256(sha256: string) {
  if (!SHA256.test(sha256))
    throw new Error(`Not a SHA-256 content address: ${sha256.slice(0, 80)}`);
}

/** Two-level fan-out keeps folders and listings small: ab/cd/abcd…. */
export function blobKey(sha256: string) {
  assertSha256(sha256);
  return `${sha256.slice(0, 2)}/${sha256.slice(2, 4)}/${sha256}`;
}
