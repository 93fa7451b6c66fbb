import 'server-only';
import { createHash, randomUUID } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdtemp, rm, stat } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { DomainError } from './errors';

let client: S3Client | undefined;
const bucket = () => process.env.S3_BUCKET ?? 'emberline';

/** S3-compatible object storage (the local fake in demo mode, S3_ENDPOINT in production). */
export function s3(): S3Client {
  if (client) return client;
  if (!process.env.S3_ENDPOINT) throw new Error('S3_ENDPOINT is not set: files cannot be stored');
  client = new S3Client({
    endpoint: process.env.S3_ENDPOINT,
    region: process.env.S3_REGION ?? 'us-east-1',
    forcePathStyle: true,
    credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID ?? '', secretAccessKey: process.env.S3_SECRET_ACCESS_KEY ?? '' },
    // The local fake stores aws-chunked framing verbatim unless checksums are only sent when required.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  return client;
}

export interface Spooled {
  file: string;
  sizeBytes: number;
  sha256: string;
  cleanup: () => Promise<void>;
}

/**
 * Streams a request body (or a file part of one) to a temporary file while hashing it, refusing
 * it as soon as it passes `maxBytes` (the rest is never read). The caller stores it and calls
 * cleanup().
 */
export async function spool(body: ReadableStream<Uint8Array> | Readable | null, maxBytes: number): Promise<Spooled> {
  if (!body) throw new DomainError('bad_request', 'empty', 'The upload is empty.');
  const dir = await mkdtemp(path.join(os.tmpdir(), 'emberline-upload-'));
  const file = path.join(dir, 'upload');
  const cleanup = () => rm(dir, { recursive: true, force: true });
  const hash = createHash('sha256');
  let size = 0;
  try {
    const source = body instanceof Readable ? body : Readable.fromWeb(body as import('node:stream/web').ReadableStream<Uint8Array>);
    await pipeline(
      source,
      async function* (chunks: AsyncIterable<Buffer>) {
        for await (const chunk of chunks) {
          size += chunk.length;
          if (size > maxBytes) {
            throw new DomainError('too_large', 'too_large', `The file is larger than the limit of ${Math.round(maxBytes / 1024 / 1024)} MB; nothing was stored.`);
          }
          hash.update(chunk);
          yield chunk;
        }
      },
      createWriteStream(file),
    );
  } catch (e) {
    await cleanup();
    throw e;
  }
  return { file, sizeBytes: size, sha256: hash.digest('hex'), cleanup };
}

/** Stores a spooled file unchanged under a new key and returns the key. */
export async function putFile(spooled: Spooled, labId: string, contentType: string): Promise<string> {
  const key = `labs/${labId}/files/${spooled.sha256.slice(0, 2)}/${randomUUID()}`;
  const { size } = await stat(spooled.file);
  await s3().send(
    new PutObjectCommand({ Bucket: bucket(), Key: key, Body: createReadStream(spooled.file), ContentLength: size, ContentType: contentType }),
  );
  return key;
}

/** Reads a stored object (optionally only its first `maxBytes`). */
export async function getObjectBuffer(key: string, maxBytes?: number): Promise<Buffer> {
  const r = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key, Range: maxBytes ? `bytes=0-${maxBytes - 1}` : undefined }));
  const bytes = await r.Body!.transformToByteArray();
  return Buffer.from(bytes);
}

export async function getObjectStream(key: string): Promise<Readable> {
  try {
    const r = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    return r.Body as Readable;
  } catch (e) {
    // a record whose bytes were never stored (the demo lab's generated log): say so, not a 500
    if (e instanceof NoSuchKey) throw new DomainError('not_found', 'not_stored', 'The raw bytes of this file are not kept in storage.');
    throw e;
  }
}
