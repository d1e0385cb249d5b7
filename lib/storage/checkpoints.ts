import { randomUUID } from "node:crypto";
import { link, mkdir, readdir, readFile, unlink, writeFile } from "node:fs/promises";
import { join, resolve } from "node:path";
import {
  GetObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";
import { env } from "@/lib/env";
import type { S3StoreOptions } from "./s3";

/**
 * Audit checkpoints are kept in the evidence store, beside the evidence files but
 * outside the database, under names that sort by event number. A name is written
 * once: a second write of the same name is refused, never overwritten.
 */
export interface CheckpointStore {
  readonly where: string;
  write(name: string, text: string): Promise<void>;
  list(): Promise<string[]>;
  read(name: string): Promise<string | null>;
}

const NAME = /^[0-9]{12}-[0-9TZ]+\.json$/;

/** `000000000042-20261202T123000123Z.json`: event number, then the time it was signed (to the millisecond). */
export function checkpointName(seq: number, at: string) {
  return `${String(seq).padStart(12, "0")}-${at.replace(/[-:.]/g, "")}.json`;
}

export function localCheckpointStore(root: string): CheckpointStore {
  const dir = join(resolve(root), "audit-checkpoints");
  return {
    where: dir,
    async write(name, text) {
      if (!NAME.test(name)) throw new Error(`Not a checkpoint name: ${name}`);
      await mkdir(dir, { recursive: true });
      // Written whole under a temporary name, then linked: link() fails if the name exists.
      const temp = join(dir, `.${randomUUID()}.part`);
      await writeFile(temp, text, { flag: "wx", mode: 0o640 });
      try {
        await link(temp, join(dir, name));
      } finally {
        await unlink(temp);
      }
    },
    async list() {
      try {
        return (await readdir(dir)).filter((n) => NAME.test(n)).sort();
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === "ENOENT") return [];
        throw error;
      }
    },
    async read(name) {
      if (!NAME.test(name)) return null;
      try {
        return await readFile(join(dir, name), "utf8");
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === "ENOENT") return null;
        throw error;
      }
    },
  };
}

export function s3CheckpointStore(options: S3StoreOptions): CheckpointStore {
  const client = new S3Client({
    endpoint: options.endpoint,
    region: options.region,
    forcePathStyle: options.forcePathStyle,
    credentials:
      options.accessKeyId && options.secretAccessKey
        ? { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey }
        : undefined,
  });
  const prefix = "audit-checkpoints/";
  return {
    where: `s3://${options.bucket}/${prefix}`,
    async write(name, text) {
      if (!NAME.test(name)) throw new Error(`Not a checkpoint name: ${name}`);
      // IfNoneMatch: a server that supports conditional writes refuses to replace an existing checkpoint.
      await client.send(
        new PutObjectCommand({
          Bucket: options.bucket,
          Key: prefix + name,
          Body: text,
          ContentType: "application/json",
          IfNoneMatch: "*",
        }),
      );
    },
    async list() {
      const names: string[] = [];
      let token: string | undefined;
      do {
        const out = await client.send(
          new ListObjectsV2Command({
            Bucket: options.bucket,
            Prefix: prefix,
            ContinuationToken: token,
          }),
        );
        for (const o of out.Contents ?? [])
          if (o.Key && NAME.test(o.Key.slice(prefix.length)))
            names.push(o.Key.slice(prefix.length));
        token = out.IsTruncated ? out.NextContinuationToken : undefined;
      } while (token);
      return names.sort();
    },
    async read(name) {
      if (!NAME.test(name)) return null;
      try {
        const out = await client.send(
          new GetObjectCommand({ Bucket: options.bucket, Key: prefix + name }),
        );
        return out.Body ? await out.Body.transformToString("utf8") : null;
      } catch (error) {
        if (
          (error as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode === 404
        )
          return null;
        throw error;
      }
    },
  };
}

let store: CheckpointStore | undefined;

/** The configured evidence store's checkpoint folder (STORAGE_DRIVER), made once per process. */
export function getCheckpointStore(): CheckpointStore {
  if (!store) {
    const e = env();
    store =
      e.STORAGE_DRIVER === "s3"
        ? s3CheckpointStore({
            bucket: e.S3_BUCKET!,
            endpoint: e.S3_ENDPOINT,
            region: e.S3_REGION,
            accessKeyId: e.S3_ACCESS_KEY_ID,
            secretAccessKey: e.S3_SECRET_ACCESS_KEY,
            forcePathStyle: e.S3_FORCE_PATH_STYLE,
          })
        : localCheckpointStore(e.UPLOAD_DIR);
  }
  return store;
}

/** Tests point the process at a folder of their own. */
export function setCheckpointStore(next: CheckpointStore | undefined) {
  store = next;
}
