import { mkdtempSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { CreateBucketCommand, S3Client } from "@aws-sdk/client-s3";
import S3rver from "s3rver";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { blobKey, localStore, s3Store, type BlobStore } from "@/lib/storage";
import { sha256OfBytes } from "@/lib/server/evidence/store-file";

const bytes = new TextEncoder().encode("%PDF-1.7 membrane report\n");
const sha = sha256OfBytes(bytes);

function storeContract(name: string, make: () => BlobStore) {
  describe(`${name} store`, () => {
    it("stores the same bytes once, however often they are put", async () => {
      const store = make();
      expect(await store.put(sha, bytes)).toEqual({ created: true });
      expect(await store.put(sha, bytes)).toEqual({ created: false });
      expect(await store.has(sha)).toBe(true);
      expect(Buffer.from((await store.get(sha))!)).toEqual(Buffer.from(bytes));
    });
    it("answers null for an address it does not hold, and refuses anything but a SHA-256", async () => {
      const store = make();
      expect(await store.get("0".repeat(64))).toBeNull();
      await expect(store.get("../../etc/passwd")).rejects.toThrow(/Not a SHA-256/);
    });
  });
}

const dir = mkdtempSync(join(tmpdir(), "washproof-store-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
storeContract("local disk", () => localStore(dir));

describe("local disk layout", () => {
  it("keeps files under their hash, outside public/, and a tampered file reads back different bytes", async () => {
    const store = localStore(dir);
    await store.put(sha, bytes);
    const path = join(dir, blobKey(sha));
    expect(readdirSync(join(dir, sha.slice(0, 2), sha.slice(2, 4)))).toEqual([sha]);
    writeFileSync(path, "tampered");
    expect(sha256OfBytes((await store.get(sha))!)).not.toBe(sha);
  });
});

let server: S3rver;
let endpoint = "";
beforeAll(async () => {
  server = new S3rver({
    port: 0,
    address: "127.0.0.1",
    silent: true,
    directory: mkdtempSync(join(tmpdir(), "washproof-s3-")),
  });
  const { port } = await server.run();
  endpoint = `http://127.0.0.1:${port}`;
  const client = new S3Client({
    endpoint,
    region: "us-east-1",
    forcePathStyle: true,
    credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
  });
  await client.send(new CreateBucketCommand({ Bucket: "washproof-evidence" }));
});
afterAll(() => server?.close());
storeContract("S3-compatible", () =>
  s3Store({
    bucket: "washproof-evidence",
    endpoint,
    region: "us-east-1",
    forcePathStyle: true,
    accessKeyId: "S3RVER",
    secretAccessKey: "S3RVER",
  }),
);
