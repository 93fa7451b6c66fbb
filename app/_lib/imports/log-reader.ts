import 'server-only';
import { z } from 'zod';
import { PRESETS } from '@/analysis/segment';
import { logCriteria, lowerBound, segmentChannels, type SegmentChannels } from './log-channels';
import { DomainError } from '../server/errors';
import { getObjectStream } from '../server/storage';
import { confirmedMappingSchema } from './apply-mapping';
import { openDelimited, type Dialect } from './read-delimited';
import { createSensorLogBuilder, type AcceptedSamples, type SensorLog } from './sensor-log';

export { logCriteria, lowerBound, segmentChannels, type SegmentChannels };

/**
 * The log reader: how a stored sensor log is read, the same for the preview (POST …/segments,
 * sensor-preview.ts) and the import (sensor-import.ts). It opens the stored file (object storage,
 * or a local file for the benchmark), counts its bytes as they are read, decodes the text and
 * detects its dialect and header (read-delimited.ts), checks the mapping against the header and
 * builds the `SensorLog` block by block (sensor-log.ts: the fast row path, else papaparse and the
 * sample schema). It also holds the read options both share (`logReadInput`), the steady-state
 * criteria from a preset and the engineer's edits (`logCriteria`), and the channels the
 * segmenter sees (`segmentChannels`).
 *
 * Owns: opening and reading a stored log, byte progress, the read input schema, criteria
 * resolution, the segmentation channels, finding a sample by line or time (`lowerBound`).
 * May import: analysis/segment, server/storage, server/errors and the import core (apply-mapping,
 * import-error, read-delimited, sensor-log). Nothing here writes to the database or knows about
 * HTTP: refusals are `ImportError`s, a file that cannot be fetched is `StoredFileUnreadable`
 * (both `DomainError`s).
 */

const criteriaKeys = Object.keys(PRESETS.laboratory).filter((k) => k !== 'preset');

/** Edits of the preset's thresholds (SI, as in SteadyCriteria); checked again by resolveCriteria. */
const criteriaEdits = z
  .record(z.string(), z.union([z.number(), z.boolean(), z.null()]))
  .refine((o) => Object.keys(o).every((k) => criteriaKeys.includes(k)), { message: `criteria may only set ${criteriaKeys.join(', ')}` });

/** How a stored log is read and segmented: the part of the input the preview and the import share. */
export const logReadInput = z
  .object({
    mapping: confirmedMappingSchema.refine((m) => m.shape === 'sensorLog', { message: 'the mapping must have shape "sensorLog"' }),
    preset: z.enum(['laboratory', 'collector', 'field']).default('laboratory'),
    criteria: criteriaEdits.optional(),
    /** lines the engineer left out; any other rejected row refuses the whole import (unless skipInvalidRows) */
    excludedLines: z.array(z.number().int().positive()).max(100_000).default([]),
    /** leave out every row that cannot be read (counted in the result) instead of refusing the file */
    skipInvalidRows: z.boolean().default(false),
  })
  .strict();
export type LogReadInput = z.infer<typeof logReadInput>;

/** The stored file a log is read from (a `source_file` row's fields). */
export interface StoredLogFile {
  filename: string;
  storageKey: string;
  sizeBytes: number;
}

export interface LogReadOptions {
  /** rejected rows listed with their line and reason (all are counted) */
  maxIssues: number;
  /** rows per parsed batch (read-delimited's default when absent) */
  batchSize?: number;
  /** the file's bytes; object storage by default (the benchmark and some tests read a local file) */
  open?: () => Promise<AsyncIterable<Uint8Array>>;
}

export interface LogProgress {
  bytesDone: number;
  bytesTotal: number;
}

/** A stored log opened for reading: its header is read and the mapping checked against it. */
export interface LogReader {
  header: string[];
  dialect: Dialect;
  /** bytes of the stored file read so far, and its size */
  progress(): LogProgress;
  /**
   * Reads the rest of the file into the log, a block of rows at a time, and yields the samples
   * accepted so far after each block (views, valid until the next block). Call once. The stored
   * file is closed when reading fails or stops early.
   * @throws ImportError as openDelimited (a text fault further into the file)
   */
  blocks(): AsyncGenerator<AcceptedSamples, void, undefined>;
  /** the whole log, after `blocks()` is done */
  finish(): SensorLog;
  /** stops reading the stored file (idempotent) */
  close(): void;
}

/**
 * Thrown when the stored file's bytes cannot be fetched (object storage failed, or the object is
 * gone): not found for the preview; the import's job retries it, as any fault on the server.
 */
export class StoredFileUnreadable extends DomainError {
  constructor(readonly cause: unknown) {
    super('not_found', 'not_found', 'The stored file could not be read; upload it again.');
    this.name = 'StoredFileUnreadable';
  }
}

/**
 * Opens a stored sensor log: fetches its bytes, decodes them, detects the dialect and the header,
 * and checks the mapping against it, before any row is read. Excluded lines are left out unread.
 * @throws StoredFileUnreadable when the bytes cannot be fetched;
 *   ImportError for an unreadable file or a mapping that does not fit the header
 * @example
 *   const reader = await openLogReader(file, input, { maxIssues: 200 });
 *   for await (const accepted of reader.blocks()) show(reader.progress());
 *   const log = reader.finish();
 */
export async function openLogReader(file: StoredLogFile, input: Pick<LogReadInput, 'mapping' | 'excludedLines'>, options: LogReadOptions): Promise<LogReader> {
  let raw: AsyncIterable<Uint8Array>;
  try {
    raw = options.open ? await options.open() : await getObjectStream(file.storageKey);
  } catch (e) {
    throw new StoredFileUnreadable(e);
  }
  const close = () => {
    const s = raw as { destroy?: () => void; destroyed?: boolean };
    if (typeof s.destroy === 'function' && !s.destroyed) s.destroy();
  };
  let bytesDone = 0;
  async function* counted() {
    for await (const chunk of raw) { bytesDone += chunk.length; yield chunk; }
  }
  const where = { file: file.filename };
  let src: Awaited<ReturnType<typeof openDelimited>>;
  let builder: ReturnType<typeof createSensorLogBuilder>;
  try {
    src = await openDelimited(counted(), { fileName: file.filename, batchSize: options.batchSize });
    builder = createSensorLogBuilder(input.mapping, src.header, where, {
      maxIssues: options.maxIssues, excludedLines: new Set(input.excludedLines), text: src.dialect, sizeHintBytes: file.sizeBytes,
    });
  } catch (e) {
    close();
    throw e;
  }
  return {
    header: src.header,
    dialect: src.dialect,
    progress: () => ({ bytesDone, bytesTotal: file.sizeBytes }),
    async *blocks() {
      let complete = false;
      try {
        for await (const block of src.blocks()) {
          builder.add(block);
          yield builder.accepted();
        }
        complete = true;
      } finally {
        if (!complete) close();
      }
    },
    finish: () => builder.finish(),
    close,
  };
}
