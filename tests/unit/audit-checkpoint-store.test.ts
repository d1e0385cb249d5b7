import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { CreateBucketCommand, S3Client } from "@aws-sdk/client-s3";
import S3rver from "s3rver";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  checkpointName,
  localCheckpointStore,
  s3CheckpointStore,
  type CheckpointStore,
} from "@/lib/storage/checkpoints";

const dir = mkdtempSync(join(tmpdir(), "washproof-cp-store-"));
let server: S3rver;
let endpoint = "";
beforeAll(async () => {
  server = new S3rver({ port: 0, address: "127.0.0.1", silent: true, directory: join(dir, "s3") });
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
afterAll(async () => {
  await server?.close();
  rmSync(dir, { recursive: true, force: true });
});

function contract(label: string, make: () => CheckpointStore) {
  describe(`checkpoint store: ${label}`, () => {
    it("keeps checkpoints under names that sort by event number, and reads them back", async () => {
      const store = make();
      const names = [
        checkpointName(120, "2026-12-02T10:00:00.000Z"),
        checkpointName(9, "2026-12-01T09:00:00.500Z"),
        checkpointName(1000, "2026-12-03T08:00:00.000Z"),
      ];
      for (const n of names) await store.write(n, `{"name":"${n}"}`);
      expect(await store.list()).toEqual([
        "000000000009-20261201T090000500Z.json",
        "000000000120-20261202T100000000Z.json",
        "000000001000-20261203T080000000Z.json",
      ]);
      expect(await store.read(names[0])).toBe(`{"name":"${names[0]}"}`);
      expect(await store.read(checkpointName(5, "2026-01-01T00:00:00.000Z"))).toBeNull();
      await expect(store.write("../escape.json", "{}")).rejects.toThrow(/Not a checkpoint name/);
    });
  });
}

contract("local folder", () => localCheckpointStore(join(dir, "local")));
contract("S3-compatible bucket", () =>
  s3CheckpointStore({
    bucket: "washproof-evidence",
    endpoint,
    region: "us-east-1",
    forcePathStyle: true,
    accessKeyId: "S3RVER",
    secretAccessKey: "S3RVER",
  }),
);

it("a local checkpoint is written once and never replaced", async () => {
  const store = localCheckpointStore(join(dir, "once"));
  const name = checkpointName(7, "2026-12-02T12:00:00.000Z");
  await store.write(name, "first");
  await expect(store.write(name, "second")).rejects.toThrow(/EEXIST/);
  expect(await store.read(name)).toBe("first");
});
