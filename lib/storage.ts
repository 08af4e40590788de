import "server-only";
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import { env } from "./env";
import { HttpError, STORE_UNAVAILABLE } from "./errors";

// Photo storage on an S3-compatible store (locally the s3rver fake from scripts/s3-fake.ts).
const cache = globalThis as unknown as { __undertoneS3?: S3Client };

/** The one S3 client for this process. */
export function storageClient(): S3Client {
  cache.__undertoneS3 ??= new S3Client({
    endpoint: env.S3_ENDPOINT,
    region: env.S3_REGION,
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
    // Path-style URLs, and no flexible checksums: without these the fake stores streamed
    // uploads corrupted and presigned URLs carry checksum parameters.
    forcePathStyle: true,
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
    // A store that is down or hangs fails the request in seconds instead of holding it open.
    requestHandler: { connectionTimeout: 3_000, requestTimeout: 30_000 },
  });
  return cache.__undertoneS3;
}

const bucket = () => env.S3_BUCKET;

function isMissing(e: unknown): boolean {
  return e instanceof S3ServiceException && (e.$metadata.httpStatusCode === 404 || e.name === "NoSuchKey");
}

/** The store gave no answer at all (refused, reset, timed out), as opposed to an S3 error reply. */
export function isStoreUnreachable(e: unknown): boolean {
  if (e instanceof S3ServiceException || !(e instanceof Error)) return false;
  const code = (e as { code?: string }).code ?? "";
  return /^(ECONNREFUSED|ECONNRESET|ETIMEDOUT|EPIPE|ENOTFOUND|EHOSTUNREACH|EAI_AGAIN|ECONNABORTED)$/.test(code) || /TimeoutError|socket hang up|RequestTimeout/i.test(`${e.name} ${e.message}`);
}

/** Runs one store call; an unreachable store becomes a 503 with a message a person can act on. */
async function send<T>(run: () => Promise<T>): Promise<T> {
  try {
    return await run();
  } catch (e) {
    if (isStoreUnreachable(e)) throw new HttpError(503, STORE_UNAVAILABLE);
    throw e;
  }
}

export type StoredObject = { size: number; contentType: string | null; etag: string | null };

/** Stores bytes under key; returns the ETag. */
export async function putObject(key: string, body: Uint8Array | string, contentType: string): Promise<string | null> {
  const out = await send(() =>
    storageClient().send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: contentType })),
  );
  return out.ETag ?? null;
}

/** The object's bytes, or null when there is no such key. */
export async function getObject(key: string): Promise<Buffer | null> {
  try {
    return await send(async () => {
      const out = await storageClient().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
      return out.Body ? Buffer.from(await out.Body.transformToByteArray()) : null;
    });
  } catch (e) {
    if (isMissing(e)) return null;
    throw e;
  }
}

/** Size and type of a stored object, or null when there is no such key. */
export async function headObject(key: string): Promise<StoredObject | null> {
  try {
    const out = await send(() => storageClient().send(new HeadObjectCommand({ Bucket: bucket(), Key: key })));
    return { size: out.ContentLength ?? 0, contentType: out.ContentType ?? null, etag: out.ETag ?? null };
  } catch (e) {
    if (isMissing(e)) return null;
    throw e;
  }
}

/** Removes the object; removing a missing key is not an error. */
export async function deleteObject(key: string): Promise<void> {
  await send(() => storageClient().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key })));
}

/**
 * A URL the browser can PUT the file to, sending the same Content-Type. The type is a signed
 * header, so S3 refuses another one; the local fake checks no V4 signatures at all, so the
 * app must still check what arrived (headObject, then decode) before trusting an upload.
 */
export function presignPut(key: string, contentType: string, expiresIn = 300): Promise<string> {
  return getSignedUrl(
    storageClient(),
    new PutObjectCommand({ Bucket: bucket(), Key: key, ContentType: contentType }),
    { expiresIn, signableHeaders: new Set(["content-type"]) },
  );
}

/** A URL that serves the object for expiresIn seconds. */
export function presignGet(key: string, expiresIn = 300): Promise<string> {
  return getSignedUrl(storageClient(), new GetObjectCommand({ Bucket: bucket(), Key: key }), { expiresIn });
}

/** Throws unless the photo bucket exists and answers. */
export async function checkBucket(): Promise<void> {
  await send(() => storageClient().send(new HeadBucketCommand({ Bucket: bucket() })));
}
