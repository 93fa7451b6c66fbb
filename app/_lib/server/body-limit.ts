import 'server-only';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import busboy from 'busboy';
import type { NextRequest } from 'next/server';
import { DomainError, badRequest } from './errors';
import { spool, type Spooled } from './storage';

/**
 * A request as route handlers see it: without its body. Every body is read through the route
 * context (`ctx.json`, `ctx.bodyStream`, `ctx.formData`), which counts the bytes as they stream
 * in, so no handler can read a body past its route's limit.
 */
export type BodylessRequest = Omit<NextRequest, 'body' | 'bodyUsed' | 'arrayBuffer' | 'blob' | 'bytes' | 'formData' | 'json' | 'text' | 'clone'>;

const size = (bytes: number) => (bytes < 1024 * 1024 ? `${Math.round(bytes / 1024)} KiB` : `${Math.round(bytes / 1024 / 1024)} MB`);

export const tooLarge = (max: number) => new DomainError('too_large', 'too_large', `The request body is larger than ${size(max)}; nothing was stored.`);

/** A file part of a multipart body, spooled to a temporary file (size and SHA-256 known). */
export interface FormFile extends Spooled {
  field: string;
  filename: string;
  contentType: string;
}

/** A multipart/form-data body read as it streamed in: the text fields and the spooled files. */
export interface StreamedForm {
  fields: ReadonlyMap<string, string>;
  files: readonly FormFile[];
}

export interface FormLimits {
  /** names of the fields that may carry a file; a file in any other field is refused (400) */
  fileFields: readonly string[];
  /** largest file part, bytes (default: the route's limit, which holds for the body as a whole) */
  maxFileBytes?: number;
  /** most file parts (default 1) */
  maxFiles?: number;
  /** most text fields (default 20) */
  maxFields?: number;
  /** largest text field, bytes (default 64 KiB) */
  maxFieldBytes?: number;
}

const NOT_MULTIPART = 'Send multipart/form-data with the file in a field named "file".';

/**
 * The one reader of a request's body, made by the route wrapper with the route's limit. The body
 * can be taken once: as a stream that counts its bytes and fails with 413 as soon as they pass
 * the limit (whether or not a Content-Length was sent: chunked bodies have none), as text, or as
 * a multipart form streamed through busboy with each file written to a temporary file. Nothing
 * holds more of the body in memory than a chunk, except text (at most the limit).
 */
export class RequestBody {
  #source: ReadableStream<Uint8Array> | null;
  #taken = false;
  #cleanups: (() => Promise<void>)[] = [];

  constructor(
    req: NextRequest,
    readonly maxBytes: number,
  ) {
    this.#source = req.body;
  }

  /** The body as a stream counted against the limit (null when the request has none). */
  stream(): ReadableStream<Uint8Array> | null {
    if (this.#taken) throw new Error('the request body was already read');
    this.#taken = true;
    const source = this.#source;
    if (!source) return null;
    const reader = source.getReader();
    const max = this.maxBytes;
    let bytes = 0;
    return new ReadableStream<Uint8Array>(
      {
        async pull(controller) {
          const { done, value } = await reader.read();
          if (done) return controller.close();
          bytes += value.byteLength;
          if (bytes > max) {
            // Stop reading: the rest is never taken in and the answer (413) goes out at once; the
            // connection, left with an unread body, is closed by Node after its keep-alive timeout.
            await reader.cancel().catch(() => {});
            return controller.error(tooLarge(max));
          }
          controller.enqueue(value);
        },
        async cancel(reason) {
          await reader.cancel(reason).catch(() => {});
        },
      },
      // pull one chunk at a time, only when the reader asks for it
      { highWaterMark: 0 },
    );
  }

  /** The whole body as UTF-8 text ('' without a body); 413 past the limit. */
  async text(): Promise<string> {
    const stream = this.stream();
    if (!stream) return '';
    const chunks: Uint8Array[] = [];
    for await (const chunk of stream as unknown as AsyncIterable<Uint8Array>) chunks.push(chunk);
    return Buffer.concat(chunks).toString('utf8');
  }

  /**
   * A multipart/form-data body, parsed as it streams (busboy): text fields are kept (each at most
   * `maxFieldBytes`), each file part is written to a temporary file while it is hashed and counted
   * (`spool`). Fails with 413 as soon as a file or the body passes its limit, 400 when the body is
   * not multipart or has parts it should not. The files are removed by `cleanup()`, which the
   * route wrapper calls after the handler.
   */
  async form(contentType: string | null, limits: FormLimits): Promise<StreamedForm> {
    const { fileFields, maxFileBytes = this.maxBytes, maxFiles = 1, maxFields = 20, maxFieldBytes = 64 * 1024 } = limits;
    if (!/^multipart\/form-data\s*;/i.test(contentType ?? '')) throw badRequest(NOT_MULTIPART);
    let bb: busboy.Busboy;
    try {
      bb = busboy({
        headers: { 'content-type': contentType! },
        defParamCharset: 'utf8',
        limits: { fields: maxFields, fieldSize: maxFieldBytes, files: maxFiles, parts: maxFields + maxFiles },
      });
    } catch {
      throw badRequest(NOT_MULTIPART);
    }
    const stream = this.stream();
    if (!stream) throw badRequest(NOT_MULTIPART);
    const fields = new Map<string, string>();
    const files: FormFile[] = [];
    const spools: Promise<unknown>[] = [];
    let failure: unknown;
    const fail = (e: unknown) => {
      failure ??= e;
      bb.destroy(e as Error);
    };
    this.#cleanups.push(() => Promise.all(files.map((f) => f.cleanup())).then(() => {}));
    bb.on('field', (name, value, info) => {
      if (info.valueTruncated) return fail(new DomainError('too_large', 'too_large', `The form field "${name.slice(0, 100)}" is larger than ${size(maxFieldBytes)}.`));
      fields.set(name, value);
    });
    bb.on('file', (name, file, info) => {
      if (!fileFields.includes(name)) {
        file.resume();
        return fail(badRequest(`The form field "${name.slice(0, 100)}" cannot hold a file; send the file in a field named "${fileFields[0]}".`));
      }
      spools.push(
        spool(file, maxFileBytes).then(
          (s) => {
            const part = { ...s, field: name, filename: info.filename || 'upload', contentType: info.mimeType || 'application/octet-stream' };
            files.push(part);
            if (failure) return part.cleanup();
          },
          fail,
        ),
      );
    });
    const tooMany = (what: string) => () => fail(badRequest(`The form has too many ${what}.`));
    bb.on('filesLimit', tooMany('files'));
    bb.on('fieldsLimit', tooMany('fields'));
    bb.on('partsLimit', tooMany('parts'));
    // busboy's own errors are malformed bodies; errors passed on from the stream (413) stay as they are
    bb.on('error', (e: Error) => fail(e instanceof DomainError || failure ? e : badRequest(`The multipart body could not be read: ${e.message}.`)));
    try {
      await pipeline(Readable.fromWeb(stream as import('node:stream/web').ReadableStream<Uint8Array>), bb);
      await Promise.all(spools);
    } catch (e) {
      failure ??= e;
    }
    if (failure) {
      await Promise.allSettled(spools);
      throw failure;
    }
    return { fields, files };
  }

  /** Removes the temporary files of a parsed form. */
  async cleanup(): Promise<void> {
    await Promise.allSettled(this.#cleanups.splice(0).map((c) => c()));
  }
}
