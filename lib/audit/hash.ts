import * as crypto from "node:crypto";

export const GENESIS_HASH = "0".repeat(64);

// The one-shot crypto.hash (Node 20.12+, 21.7+) skips building a Hash object per call: verifying a
// million-event chain is mostly these calls. Older runtimes fall back to createHash.
const oneShot = (
  crypto as { hash?: (algorithm: string, data: string | Uint8Array, encoding: "hex") => string }
).hash;

export const sha256Hex: (input: string | Uint8Array) => string = oneShot
  ? (input) => oneShot("sha256", input, "hex")
  : (input) => crypto.createHash("sha256").update(input).digest("hex");

/** The fields of an audit row that its hash covers, in a fixed order. */
export interface ChainedFields {
  seq: number;
  at: string;
  actorId: string | null;
  actorName: string;
  action: string;
  recordType: string;
  recordId: string;
  oldValue: string | null;
  newValue: string | null;
  reason: string | null;
  prevHash: string;
}

/**
 * Each event's hash covers the previous event's hash and its own fields, so
 * altering, inserting or removing any row breaks every link after it.
 * A fixed-order array (not an object) keeps the hashed text unambiguous and cheap.
 */
export function chainHash(f: ChainedFields): string {
  return sha256Hex(
    JSON.stringify([
      f.prevHash,
      f.seq,
      f.at,
      f.actorId,
      f.actorName,
      f.action,
      f.recordType,
      f.recordId,
      f.oldValue,
      f.newValue,
      f.reason,
    ]),
  );
}
