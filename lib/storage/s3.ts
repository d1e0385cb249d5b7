import { GetObjectCommand, HeadObjectCommand, NoSuchKey, NotFound, PutObjectCommand, S3Client, S3ServiceException } from "@aws-sdk/client-s3";
import { blobKey, type BlobStore } from "./types";

export interface S3StoreOptions {
  bucket: string;
  endpoint?: string;
  region: string;
  accessKeyId?: string;
  secretAccessKey?: string;
  forcePathStyle: boolean;
}

function isMissing(error: unknown) {
  return (
    error instanceof NoSuchKey ||
    error instanceof NotFound ||
    (error instanceof S3ServiceException && error.$metadata.httpStatusCode === 404)
  );
}

/** S3-compatible object storage; objects are keyed by their hash under `sha256/`. */
export function s3Store(options: S3StoreOptions): BlobStore {
  const client = new S3Client({
    endpoint: options.endpoint,
    region: options.region,
    forcePathStyle: options.forcePathStyle,
    credentials:
      options.accessKeyId && options.secretAccessKey
        ? { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey }
        : undefined,
  });
  const key = (sha256: string) => `sha256/${blobKey(sha256)}`;
  async function has(sha256: string) {
    try {
      await client.send(new HeadObjectCommand({ Bucket: options.bucket, Key: key(sha256) }));
      return true;
    } catch (error) {
      if (isMissing(error)) return false;
      throw error;
    }
  }
  return {
    driver: "s3",
    has,
    async put(sha256, bytes) {
      if (await has(sha256)) return { created: false };
      await client.send(new PutObjectCommand({ Bucket: options.bucket, Key: key(sha256), Body: bytes, ContentLength: bytes.byteLength }));
      return { created: true };
    },
    async get(sha256) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket: options.bucket, Key: key(sha256) }));
        return out.Body ? await out.Body.transformToByteArray() : new Uint8Array();
      } catch (error) {
        if (isMissing(error)) return null;
        throw error;
      }
    },
  };
}
