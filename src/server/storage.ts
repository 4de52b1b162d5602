import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import type { Readable } from 'node:stream';
import { env } from './env';

let client: S3Client | undefined;

/** The store's address and credentials, and checksums only where the store requires them. */
function clientConfig() {
  const e = env();
  return {
    endpoint: e.S3_ENDPOINT,
    region: e.S3_REGION,
    forcePathStyle: e.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY },
    requestChecksumCalculation: 'WHEN_REQUIRED' as const,
    responseChecksumValidation: 'WHEN_REQUIRED' as const,
  };
}

/**
 * The one S3 client. Locally it talks to the s3rver fake in fakes/; a hosted store is a change of
 * S3_* variables. requestChecksumCalculation 'WHEN_REQUIRED' keeps the presigner from adding an
 * empty-body CRC32 that a real store rejects on a browser PUT.
 */
export function s3(): S3Client {
  client ??= new S3Client(clientConfig());
  return client;
}

export function bucket(): string {
  return env().S3_BUCKET;
}

/**
 * Presigned PUT for a browser upload straight into the store. The content type is signed; with
 * contentLength the length is signed too, so a store that checks signatures refuses other bodies
 * (the server checks the stored object's size and type again before reading it).
 */
export async function presignPut(key: string, contentType: string, expiresInSeconds = 15 * 60, contentLength?: number): Promise<string> {
  return getSignedUrl(s3(), new PutObjectCommand({ Bucket: bucket(), Key: key, ContentType: contentType, ContentLength: contentLength }), {
    expiresIn: expiresInSeconds,
    ...(contentLength !== undefined ? { signableHeaders: new Set(['content-type', 'content-length']) } : {}),
  });
}

/** Size [bytes] and content type of a stored object, or null when it is not there. */
export async function objectHead(key: string): Promise<{ size: number; contentType: string | null } | null> {
  try {
    const out = await s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
    return { size: out.ContentLength ?? 0, contentType: out.ContentType ?? null };
  } catch {
    return null;
  }
}

export async function putObject(key: string, body: Buffer | Uint8Array | string | Readable, contentLength?: number) {
  await s3().send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentLength: contentLength }));
}

let rawClient: S3Client | undefined;

/**
 * The client raw files are stored with: as s3() but its requests carry UNSIGNED-PAYLOAD instead of
 * the body's SHA-256 (the SDK would hash every buffered part once more only to sign it; the
 * upload hashes the file itself, and the store checks each part's MD5). The signature still covers
 * the request's headers; presigned URLs never come from this client.
 */
function rawS3(): S3Client {
  if (rawClient) return rawClient;
  rawClient = new S3Client(clientConfig());
  rawClient.middlewareStack.add(
    (next) => async (args) => {
      const req = args.request as { headers?: Record<string, string> };
      if (req.headers) req.headers['x-amz-content-sha256'] = 'UNSIGNED-PAYLOAD';
      return next(args);
    },
    { step: 'build', name: 'losslineUnsignedPayload' },
  );
  return rawClient;
}

/** Part size of a raw file's multipart upload [bytes]; PARTS_IN_FLIGHT parts are held at once. */
const PART_BYTES = 8 * 1024 * 1024;
const PARTS_IN_FLIGHT = 4;

/**
 * Stores a streamed raw file. With its length known (a request's Content-Length) the body streams
 * through as ONE PUT: no part is buffered, and the store writes the object once (a multipart upload
 * is written part by part and then copied whole into the object). Without it, a multipart upload.
 */
export async function putRawStream(key: string, body: Readable, contentType: string, contentLength?: number): Promise<void> {
  // The SDK does not listen for the body's errors: an error of the body stops the request here, and
  // whatever part of the object the store kept is removed (a real store never keeps a broken PUT).
  const abort = new AbortController();
  const broken = new Promise<never>((_, reject) =>
    body.once('error', (err) => {
      abort.abort();
      reject(err);
    }),
  );
  broken.catch(() => undefined);
  try {
    if (contentLength !== undefined) {
      const put = rawS3().send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: contentType, ContentLength: contentLength }), { abortSignal: abort.signal });
      await Promise.race([put, broken]);
      return;
    }
    const upload = new Upload({
      client: rawS3(),
      params: { Bucket: bucket(), Key: key, Body: body, ContentType: contentType },
      queueSize: PARTS_IN_FLIGHT,
      partSize: PART_BYTES,
      abortController: abort,
    });
    await Promise.race([upload.done(), broken]);
  } catch (err) {
    abort.abort();
    if (contentLength !== undefined) await deleteObject(key).catch(() => undefined);
    throw err;
  }
}

export async function deleteObject(key: string): Promise<void> {
  await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
}

export async function objectStream(key: string): Promise<Readable> {
  const out = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
  return out.Body as Readable;
}

export async function objectSize(key: string): Promise<number | null> {
  try {
    const out = await s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
    return out.ContentLength ?? null;
  } catch {
    return null;
  }
}

/** True when the bucket answers. */
export async function storageReachable(): Promise<boolean> {
  try {
    await s3().send(new HeadBucketCommand({ Bucket: bucket() }));
    return true;
  } catch {
    return false;
  }
}

/** Creates the bucket when it is missing (used by set-up scripts, not by requests). */
export async function ensureBucket(): Promise<void> {
  if (await storageReachable()) return;
  await s3().send(new CreateBucketCommand({ Bucket: bucket() }));
}
