import {
  CreateBucketCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import type { Readable } from 'node:stream';
import { env } from './env';

let client: S3Client | undefined;

/**
 * The one S3 client. Locally it talks to the s3rver fake in fakes/; a hosted store is a change of
 * S3_* variables. requestChecksumCalculation 'WHEN_REQUIRED' keeps the presigner from adding an
 * empty-body CRC32 that a real store rejects on a browser PUT.
 */
export function s3(): S3Client {
  const e = env();
  client ??= new S3Client({
    endpoint: e.S3_ENDPOINT,
    region: e.S3_REGION,
    forcePathStyle: e.S3_FORCE_PATH_STYLE,
    credentials: { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
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
