import {
  createHash,
  createPrivateKey,
  createPublicKey,
  generateKeyPairSync,
  sign,
  verify,
  type KeyObject,
} from "node:crypto";
import { canonicalJson } from "./canonical-json";
import type { ChainBreak } from "./verify";

/**
 * A chain-head checkpoint: "event `seq` of this audit trail had hash `hash` at
 * `at`", signed with an Ed25519 key held outside the database. Anyone who can
 * rewrite the database file can re-chain every hash after an edit, but cannot
 * make a signature that verifies with the installation's public key, so a
 * stored checkpoint pins the chain up to its event.
 */
export interface CheckpointBody {
  v: 1;
  seq: number;
  hash: string;
  at: string;
  /** Who asked: "schedule", or the name of the person who pressed the button. */
  by: string;
  /** First 16 hex digits of the SHA-256 of the public key (SPKI DER), so a reader knows which key to check with. */
  keyId: string;
}
export interface SignedCheckpoint extends CheckpointBody {
  /** Ed25519 signature of canonicalJson(body), base64. */
  signature: string;
}

/** What a signature covers: the body as canonical JSON, so key order never matters. */
export function checkpointText(body: CheckpointBody): string {
  const { v, seq, hash, at, by, keyId } = body;
  return canonicalJson({ v, seq, hash, at, by, keyId });
}

export function keyIdOf(key: KeyObject): string {
  const pub = key.type === "private" ? createPublicKey(key) : key;
  return createHash("sha256")
    .update(pub.export({ type: "spki", format: "der" }))
    .digest("hex")
    .slice(0, 16);
}

/** Reads a PEM (PKCS#8) Ed25519 private key; refuses any other kind with a message naming the problem. */
export function parseSigningKey(pem: string): KeyObject {
  const key = createPrivateKey(pem);
  if (key.asymmetricKeyType !== "ed25519")
    throw new Error(`the audit signing key must be an Ed25519 key, not ${key.asymmetricKeyType}`);
  return key;
}

/** A fresh Ed25519 private key as PKCS#8 PEM. */
export function generateSigningKeyPem(): string {
  return generateKeyPairSync("ed25519")
    .privateKey.export({ type: "pkcs8", format: "pem" })
    .toString();
}

export function signCheckpoint(
  head: { seq: number; hash: string },
  privateKey: KeyObject,
  by: string,
  now = new Date(),
): SignedCheckpoint {
  const body: CheckpointBody = {
    v: 1,
    seq: head.seq,
    hash: head.hash,
    at: now.toISOString(),
    by,
    keyId: keyIdOf(privateKey),
  };
  const signature = sign(null, Buffer.from(checkpointText(body)), privateKey).toString("base64");
  return { ...body, signature };
}

export function checkpointSignatureHolds(cp: SignedCheckpoint, publicKey: KeyObject): boolean {
  try {
    return verify(
      null,
      Buffer.from(checkpointText(cp)),
      publicKey,
      Buffer.from(cp.signature, "base64"),
    );
  } catch {
    return false;
  }
}

/** Parses a stored checkpoint file, or null when it is not one. */
export function parseCheckpoint(text: string): SignedCheckpoint | null {
  try {
    const v = JSON.parse(text) as Partial<SignedCheckpoint>;
    if (
      v.v !== 1 ||
      !Number.isSafeInteger(v.seq) ||
      typeof v.hash !== "string" ||
      typeof v.at !== "string" ||
      typeof v.by !== "string" ||
      typeof v.keyId !== "string" ||
      typeof v.signature !== "string"
    )
      return null;
    return v as SignedCheckpoint;
  } catch {
    return null;
  }
}

const when = (at: string) => at.replace("T", " ").slice(0, 19) + " UTC";

/**
 * Compares the chain as stored with every checkpoint. `storedHashAt` gives the
 * hash the database now holds for an event (undefined when there is no such
 * event); `lastSeq` is the highest event number present. Each finding names the
 * checkpoint and, where the previous checkpoint still matches, the span of events
 * the rewrite lies in. Events after the newest checkpoint are not covered.
 */
export function compareWithCheckpoints(
  checkpoints: SignedCheckpoint[],
  storedHashAt: (seq: number) => string | undefined,
  lastSeq: number,
  publicKey: KeyObject,
): ChainBreak[] {
  const breaks: ChainBreak[] = [];
  const keyId = keyIdOf(publicKey);
  let lastGood = 0;
  for (const cp of [...checkpoints].sort((a, b) => a.seq - b.seq || a.at.localeCompare(b.at))) {
    if (cp.keyId !== keyId || !checkpointSignatureHolds(cp, publicKey)) {
      breaks.push({
        seq: cp.seq,
        reason: `the checkpoint dated ${when(cp.at)} for event ${cp.seq} is not signed by this installation's key (${keyId}): it was forged or altered`,
      });
      continue;
    }
    const stored = storedHashAt(cp.seq);
    const span = lastGood + 1 < cp.seq ? `events ${lastGood + 1}–${cp.seq}` : `event ${cp.seq}`;
    if (stored === undefined && cp.seq > lastSeq) {
      breaks.push({
        seq: cp.seq,
        reason: `the checkpoint dated ${when(cp.at)} holds event ${cp.seq}, but the trail now ends at event ${lastSeq}: events ${lastSeq + 1}–${cp.seq} at least were cut off`,
      });
    } else if (stored === undefined) {
      breaks.push({
        seq: cp.seq,
        reason: `event ${cp.seq}, held by the checkpoint dated ${when(cp.at)}, is missing`,
      });
    } else if (stored !== cp.hash) {
      breaks.push({
        seq: cp.seq,
        reason: `event ${cp.seq} no longer has the hash signed in the checkpoint dated ${when(cp.at)}: ${span} were rewritten (edited, inserted or removed, and re-chained)`,
      });
    } else {
      lastGood = Math.max(lastGood, cp.seq);
    }
  }
  return breaks;
}
