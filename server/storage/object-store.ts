// Photos live in an S3-compatible object store, through the official SDK. In production any such
// service (S3_ENDPOINT…); here a local fake that the start command and the tests start themselves.
import { CreateBucketCommand, GetObjectCommand, HeadBucketCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import type { Readable } from "node:stream";

export interface ObjectStoreSettings {
  endpoint: string;
  bucket: string;
  region: string;
  accessKeyId: string;
  secretAccessKey: string;
}

export interface ObjectStore {
  put(key: string, body: Buffer, contentType: string): Promise<void>;
  get(key: string): Promise<{ body: Readable; contentType: string; size: number } | undefined>;
  ensureBucket(): Promise<void>;
  /** Every key in the bucket (for backups). */
  list(): AsyncIterable<string>;
}

export function createObjectStore(settings: ObjectStoreSettings): ObjectStore {
  const client = new S3Client({
    endpoint: settings.endpoint,
    region: settings.region,
    forcePathStyle: true,
    credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
    // Without these the SDK frames streamed bodies as aws-chunked, which some stores keep verbatim.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
    maxAttempts: 3,
  });
  const Bucket = settings.bucket;
  return {
    async ensureBucket() {
      try {
        await client.send(new HeadBucketCommand({ Bucket }));
      } catch {
        try {
          await client.send(new CreateBucketCommand({ Bucket }));
        } catch (err) {
          // Another server created it a moment ago: that is what we wanted.
          const name = (err as { name?: string }).name;
          if (name !== "BucketAlreadyOwnedByYou" && name !== "BucketAlreadyExists") throw err;
        }
      }
    },
    async put(Key, Body, ContentType) {
      await client.send(new PutObjectCommand({ Bucket, Key, Body, ContentType, ContentLength: Body.byteLength }));
    },
    async *list() {
      let ContinuationToken: string | undefined;
      do {
        const page = await client.send(new ListObjectsV2Command({ Bucket, ContinuationToken }));
        for (const o of page.Contents ?? []) if (o.Key) yield o.Key;
        ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (ContinuationToken);
    },
    async get(Key) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket, Key }));
        return { body: out.Body as Readable, contentType: out.ContentType ?? "application/octet-stream", size: Number(out.ContentLength ?? 0) };
      } catch (err) {
        if ((err as { name?: string }).name === "NoSuchKey") return undefined;
        throw err;
      }
    },
  };
}
