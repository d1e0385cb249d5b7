import "server-only";
import { createPublicKey, type KeyObject } from "node:crypto";
import { existsSync, linkSync, mkdirSync, readFileSync, unlinkSync, writeFileSync } from "node:fs";
import { dirname, resolve } from "node:path";
import { generateSigningKeyPem, keyIdOf, parseSigningKey } from "@/lib/audit/checkpoint";
import { env } from "@/lib/env";

export interface SigningKey {
  privateKey: KeyObject;
  publicKey: KeyObject;
  keyId: string;
  /** Where the key came from, said on the integrity page so nobody mistakes a generated key for a kept one. */
  source: "environment" | "file" | "generated";
  path?: string;
}

/** Where the demo and tests keep a key they made themselves when none is configured. */
export const GENERATED_KEY_PATH = "data/audit-signing-key.pem";

let cached: SigningKey | undefined;

function fromPem(pem: string, source: SigningKey["source"], path?: string): SigningKey {
  const privateKey = parseSigningKey(pem);
  return {
    privateKey,
    publicKey: createPublicKey(privateKey),
    keyId: keyIdOf(privateKey),
    source,
    path,
  };
}

/**
 * The checkpoint signing key: AUDIT_SIGNING_KEY (PEM text) or AUDIT_SIGNING_KEY_FILE.
 * With neither, outside production, a key is generated once in data/ and reused; that
 * key lies beside the database, so it proves nothing against someone holding both,
 * and the integrity page says so. In production a key must be configured.
 */
export function getSigningKey(): SigningKey {
  if (cached) return cached;
  const e = env();
  if (e.AUDIT_SIGNING_KEY) {
    cached = fromPem(e.AUDIT_SIGNING_KEY.replace(/\\n/g, "\n"), "environment");
  } else if (e.AUDIT_SIGNING_KEY_FILE) {
    const path = resolve(e.AUDIT_SIGNING_KEY_FILE);
    cached = fromPem(readFileSync(path, "utf8"), "file", path);
  } else {
    if (e.NODE_ENV === "production" && !e.DEMO_MODE) {
      throw new Error(
        "No audit signing key is configured: set AUDIT_SIGNING_KEY_FILE (or AUDIT_SIGNING_KEY) to an Ed25519 private key in PEM form.",
      );
    }
    const path = resolve(GENERATED_KEY_PATH);
    if (!existsSync(path)) {
      mkdirSync(dirname(path), { recursive: true });
      // Written whole, then linked into place: a parallel process sees no key or a whole one, and the first link wins.
      const temp = `${path}.${process.pid}.part`;
      writeFileSync(temp, generateSigningKeyPem(), { mode: 0o600 });
      try {
        linkSync(temp, path);
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code !== "EEXIST") throw error;
      } finally {
        unlinkSync(temp);
      }
      console.warn(
        `No AUDIT_SIGNING_KEY_FILE is configured: generated an audit checkpoint key at ${path}. Configure a key kept off this machine for real use.`,
      );
    }
    cached = fromPem(readFileSync(path, "utf8"), "generated", path);
  }
  return cached;
}

/** Tests sign with a key of their own. */
export function setSigningKey(pem: string | undefined) {
  cached = pem === undefined ? undefined : fromPem(pem, "environment");
}
