import "server-only";
/**
 * The object store, spoken only through the S3 API (s3rver locally, any S3-compatible store in
 * production). Every failure to reach the store becomes ObjectStoreUnavailableError, an AppError
 * that route handlers answer with 503 and jobs treat as "retry later"; a missing object is
 * reported as null, never as an exception a caller could mistake for an outage.
 *
 * Keys are never taken from a request: callers pass keys built by lib/photos/object-keys.ts.
 */
import { createHash } from "node:crypto";
import type { Readable } from "node:stream";
import { CopyObjectCommand, DeleteObjectCommand, GetObjectCommand, HeadBucketCommand, HeadObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { AppError } from "@/lib/errors";
import { env } from "@/lib/env";

export const STORE_UNAVAILABLE_MESSAGE = "The photo store is not reachable right now, so nothing was saved. Your file is still on your device; try again in a moment.";

export class ObjectStoreUnavailableError extends AppError {
  constructor(cause?: unknown) {
    super("unavailable", STORE_UNAVAILABLE_MESSAGE, { cause });
    this.name = "ObjectStoreUnavailableError";
  }
}

export type ObjectStoreConfig = {
  endpoint?: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  forcePathStyle: boolean;
};

export type ObjectStore = { client: S3Client; bucket: string };

export function createObjectStore(config: ObjectStoreConfig): ObjectStore {
  const client = new S3Client({
    region: config.region,
    endpoint: config.endpoint,
    forcePathStyle: config.forcePathStyle,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    // Without these the SDK signs a CRC32 of an *empty* body into presigned PUT URLs, which a real
    // S3 would refuse for any non-empty upload (docs/stack.md, "Object store").
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
    // Fail fast when the store is down: the person gets a clear 503 and retries; jobs back off.
    maxAttempts: 2,
    requestHandler: { connectionTimeout: 3_000, requestTimeout: 60_000 },
  });
  return { client, bucket: config.bucket };
}

const cache = globalThis as unknown as { __partproofStore?: ObjectStore };

/** The store configured by the S3_* variables (one client per process). */
export function objectStore(): ObjectStore {
  if (!cache.__partproofStore) {
    const e = env();
    cache.__partproofStore = createObjectStore({
      endpoint: e.S3_ENDPOINT,
      region: e.S3_REGION,
      bucket: e.S3_BUCKET,
      accessKeyId: e.S3_ACCESS_KEY_ID,
      secretAccessKey: e.S3_SECRET_ACCESS_KEY,
      forcePathStyle: e.S3_FORCE_PATH_STYLE,
    });
  }
  return cache.__partproofStore;
}

type SdkError = { name?: string; $metadata?: { httpStatusCode?: number } };
const statusOf = (err: unknown) => (err as SdkError | null)?.$metadata?.httpStatusCode;
const isMissing = (err: unknown) => statusOf(err) === 404 || ["NotFound", "NoSuchKey"].includes((err as SdkError | null)?.name ?? "");

/** An SDK error with no HTTP answer at all (refused, reset, timed out) or a 5xx: the store is unavailable. */
function sdkErrorMeansUnavailable(err: unknown): boolean {
  const status = statusOf(err);
  return status === undefined || status >= 500;
}

async function call<T>(run: () => Promise<T>): Promise<T> {
  try {
    return await run();
  } catch (err) {
    if (sdkErrorMeansUnavailable(err)) throw new ObjectStoreUnavailableError(err);
    throw err;
  }
}

async function callOrNull<T>(run: () => Promise<T>): Promise<T | null> {
  try {
    return await run();
  } catch (err) {
    if (isMissing(err)) return null;
    if (sdkErrorMeansUnavailable(err)) throw new ObjectStoreUnavailableError(err);
    throw err;
  }
}

/** Throws ObjectStoreUnavailableError unless the bucket answers. */
export async function checkStore(store: ObjectStore): Promise<void> {
  await call(() => store.client.send(new HeadBucketCommand({ Bucket: store.bucket })));
}

/**
 * A presigned PUT for exactly `contentLength` bytes: the length is one of the signed headers
 * (X-Amz-SignedHeaders=content-length;host), so S3 refuses a body of any other length with a
 * signature mismatch. The browser sets Content-Length itself from the file it sends. (s3rver,
 * the local store, does not check signatures at all; finalise checks the length it finds.)
 */
export async function presignPut(store: ObjectStore, key: string, { contentType, contentLength, expiresInSeconds }: { contentType: string; contentLength: number; expiresInSeconds: number }) {
  return getSignedUrl(store.client, new PutObjectCommand({ Bucket: store.bucket, Key: key, ContentType: contentType, ContentLength: contentLength }), { expiresIn: expiresInSeconds });
}

export async function presignGet(store: ObjectStore, key: string, { expiresInSeconds, contentType, downloadName }: { expiresInSeconds: number; contentType?: string; downloadName?: string }) {
  const command = new GetObjectCommand({
    Bucket: store.bucket,
    Key: key,
    ResponseContentType: contentType,
    ResponseContentDisposition: downloadName ? `attachment; filename="${downloadName.replace(/[^\w.-]/g, "_")}"` : undefined,
    ResponseCacheControl: "private, no-store",
  });
  return getSignedUrl(store.client, command, { expiresIn: expiresInSeconds });
}

export type ObjectHead = { bytes: number; etag: string | null; lastModified: Date | null };

export async function headObject(store: ObjectStore, key: string): Promise<ObjectHead | null> {
  const head = await callOrNull(() => store.client.send(new HeadObjectCommand({ Bucket: store.bucket, Key: key })));
  return head ? { bytes: head.ContentLength ?? 0, etag: head.ETag ?? null, lastModified: head.LastModified ?? null } : null;
}

export async function putObject(store: ObjectStore, key: string, body: Buffer, { contentType }: { contentType: string }) {
  await call(() => store.client.send(new PutObjectCommand({ Bucket: store.bucket, Key: key, Body: body, ContentType: contentType })));
}

/** Server-side copy inside the bucket (the bytes never pass through this process). */
export async function copyObject(store: ObjectStore, fromKey: string, toKey: string): Promise<boolean> {
  const copied = await callOrNull(() => store.client.send(new CopyObjectCommand({ Bucket: store.bucket, Key: toKey, CopySource: `${store.bucket}/${encodeURI(fromKey)}` })));
  return copied !== null;
}

/** Deleting a key that is already gone succeeds (S3 semantics), so retries are harmless. */
export async function deleteObject(store: ObjectStore, key: string) {
  await call(() => store.client.send(new DeleteObjectCommand({ Bucket: store.bucket, Key: key })));
}

export async function getObjectBuffer(store: ObjectStore, key: string): Promise<Buffer | null> {
  return callOrNull(async () => {
    const res = await store.client.send(new GetObjectCommand({ Bucket: store.bucket, Key: key }));
    return Buffer.from(await res.Body!.transformToByteArray());
  });
}

export type ObjectStream = { body: ReadableStream; bytes: number | null; etag: string | null; contentType: string | null };

export async function getObjectStream(store: ObjectStore, key: string): Promise<ObjectStream | null> {
  return callOrNull(async () => {
    const res = await store.client.send(new GetObjectCommand({ Bucket: store.bucket, Key: key }));
    return { body: res.Body!.transformToWebStream(), bytes: res.ContentLength ?? null, etag: res.ETag ?? null, contentType: res.ContentType ?? null };
  });
}

/**
 * Reads an object once, streaming: its SHA-256, its exact length and its first `headBytes`
 * bytes (for the magic-byte sniff), without holding the whole file in memory.
 */
export async function digestObject(store: ObjectStore, key: string, headBytes = 4096): Promise<{ sha256: string; bytes: number; head: Buffer } | null> {
  return callOrNull(async () => {
    const res = await store.client.send(new GetObjectCommand({ Bucket: store.bucket, Key: key }));
    const hash = createHash("sha256");
    const head: Buffer[] = [];
    let headLength = 0;
    let bytes = 0;
    for await (const chunk of res.Body as Readable) {
      const buffer = chunk as Buffer;
      hash.update(buffer);
      bytes += buffer.length;
      if (headLength < headBytes) {
        head.push(buffer.subarray(0, headBytes - headLength));
        headLength += Math.min(buffer.length, headBytes - headLength);
      }
    }
    return { sha256: hash.digest("hex"), bytes, head: Buffer.concat(head) };
  });
}

export type ListedObject = { key: string; bytes: number; lastModified: Date };

/** Every object under a prefix, page by page. */
export async function* listObjects(store: ObjectStore, prefix: string): AsyncGenerator<ListedObject> {
  let token: string | undefined;
  do {
    const page = await call(() => store.client.send(new ListObjectsV2Command({ Bucket: store.bucket, Prefix: prefix, ContinuationToken: token })));
    for (const item of page.Contents ?? []) {
      if (item.Key) yield { key: item.Key, bytes: item.Size ?? 0, lastModified: item.LastModified ?? new Date(0) };
    }
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
}
