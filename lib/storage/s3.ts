import type { S3Client } from "@aws-sdk/client-s3";
import { blobKey, type BlobStore } from "./types";

export interface S3StoreOptions {
  bucket: string;
  endpoint?: string;
  region: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  forcePathStyle: boolean;
}

type Sdk = typeof import("@aws-sdk/client-s3");

function isMissing(sdk: Sdk, error: unknown) {
  const { NoSuchKey, NotFound, S3ServiceException } = sdk;
  return (
    error instanceof NoSuchKey ||
    error instanceof NotFound ||
    (error instanceof S3ServiceException && error.$metadata.httpStatusCode === 404)
  );
}

/**
 * S3-compatible object storage; objects are keyed by their hash under `sha256/`.
 * The SDK is large, so it is loaded on first use: a plant on local storage never loads it.
 */
export function s3Store(options: S3StoreOptions): BlobStore {
  let connection: Promise<{ sdk: Sdk; client: S3Client }> | undefined;
  const connect = () =>
    (connection ??= import("@aws-sdk/client-s3").then((sdk) => ({
      sdk,
      client: new sdk.S3Client({
        endpoint: options.endpoint,
        region: options.region,
        forcePathStyle: options.forcePathStyle,
        credentials:
          options.accessKeyId && options.secretAccessKey
            ? { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey }
            : undefined,
      }),
    })));
  const key = (sha256: string) => `sha256/${blobKey(sha256)}`;
  async function has(sha256: string) {
    const { sdk, client } = await connect();
    try {
      await client.send(new sdk.HeadObjectCommand({ Bucket: options.bucket, Key: key(sha256) }));
      return true;
    } catch (error) {
      if (isMissing(sdk, error)) return false;
      throw error;
    }
  }
  return {
    driver: "s3",
    has,
    async put(sha256, bytes) {
      if (await has(sha256)) return { created: false };
      const { sdk, client } = await connect();
      await client.send(
        new sdk.PutObjectCommand({
          Bucket: options.bucket,
          Key: key(sha256),
          Body: bytes,
          ContentLength: bytes.byteLength,
        }),
      );
      return { created: true };
    },
    async get(sha256) {
      const { sdk, client } = await connect();
      try {
        const out = await client.send(
          new sdk.GetObjectCommand({ Bucket: options.bucket, Key: key(sha256) }),
        );
        return out.Body ? await out.Body.transformToByteArray() : new Uint8Array();
      } catch (error) {
        if (isMissing(sdk, error)) return null;
        throw error;
      }
    },
  };
}
