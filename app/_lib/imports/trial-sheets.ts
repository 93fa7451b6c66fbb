import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { ColumnMapping, SourceFile, Trial, type LabRow, type RigRow, type SourceFileRow, type UserRow } from '@/entities';
import { isUuid } from '../labs/load-in-lab';
import { trialFields } from '../rigs/trial-rule';
import { DomainError } from '../server/errors';
import {
  ImportError, confirmedMappingSchema, headerSignature, importTrialSheet, listSheets, readDelimited, readXlsxSheet, suggestMapping,
  type CellTable, type SensorLog, type TrialSheetResult,
} from '.';
import { logMappingFrom, readLogHead, suggestShape } from './suggest-shape';
import { getObjectBuffer, putFile, spool, type Spooled } from '../server/storage';

/** Upload size limit (IMPORT_MAX_BYTES, default 100 MB), enforced while the body streams in. */
export const maxUploadBytes = () => Number(process.env.IMPORT_MAX_BYTES ?? 100 * 1024 * 1024);
/** Trial sheets up to this size are previewed and imported within the request. */
const INLINE_MAX_BYTES = 20 * 1024 * 1024;

export const sourceFileDto = (f: SourceFileRow) => ({
  id: f.id,
  filename: f.filename,
  sizeBytes: f.sizeBytes,
  sha256: f.sha256,
  state: f.state,
  rowsImported: f.rowsImported,
  createdAt: f.createdAt.toISOString(),
});

/** Stores an upload unchanged (streamed, hashed, size-limited). The same bytes uploaded twice in a lab are recognised. */
export async function storeUpload(em: EntityManager, rig: RigRow, user: UserRow, body: ReadableStream<Uint8Array> | null, filename: string, contentType: string) {
  const spooled = await spool(body, maxUploadBytes());
  try {
    return await storeSpooled(em, rig, user, spooled, filename, contentType);
  } finally {
    await spooled.cleanup();
  }
}

/** Stores a spooled upload (a raw body or a multipart file part) unchanged; the caller removes the spooled file. */
export async function storeSpooled(em: EntityManager, rig: RigRow, user: UserRow, spooled: Spooled, filename: string, contentType: string) {
  if (spooled.sizeBytes === 0) throw new DomainError('invalid', 'empty', `"${filename}" is empty: there is nothing to import.`);
  const existing = await em.findOne(SourceFile, { lab: rig.lab, sha256: spooled.sha256, purpose: 'trials' });
  if (existing) return { file: existing, duplicate: true };
  const storageKey = await putFile(spooled, rig.lab.id, contentType);
  const file = em.create(SourceFile, { lab: rig.lab, rig, uploadedBy: user, filename: filename.slice(0, 255), contentType: contentType.slice(0, 120), sizeBytes: spooled.sizeBytes, sha256: spooled.sha256, storageKey });
  await em.flush();
  return { file, duplicate: false };
}

const isZip = (b: Buffer) => b.length > 4 && b[0] === 0x50 && b[1] === 0x4b && b[2] === 0x03 && b[3] === 0x04;

/** Bytes read from the head of a text file too large to read whole for the mapping screen. */
const HEAD_BYTES = 512 * 1024;

async function readTable(file: SourceFileRow, sheet?: string, opts: { headOnly?: boolean } = {}) {
  const large = file.sizeBytes > INLINE_MAX_BYTES;
  if (large && !opts.headOnly) {
    throw new DomainError('too_large', 'too_large_inline', `"${file.filename}" is over ${INLINE_MAX_BYTES / 1024 / 1024} MB: import it as a sensor log (it runs in the background), or split the trial sheet into smaller files.`);
  }
  let buf = await getObjectBuffer(file.storageKey, large ? HEAD_BYTES : undefined);
  try {
    if (isZip(buf)) {
      if (large) throw new DomainError('too_large', 'too_large_inline', `"${file.filename}" is a workbook over ${INLINE_MAX_BYTES / 1024 / 1024} MB: save the sheet as CSV to import it as a sensor log, or split it.`);
      const sheets = await listSheets(buf, { fileName: file.filename });
      const t = await readXlsxSheet(buf, sheet ?? sheets[0]?.name, { fileName: file.filename });
      return { kind: 'xlsx' as const, partial: false, sheets, table: t as CellTable, header: t.header, metadata: t.metadata, warnings: t.cellWarnings.map((w) => w.message), decimal: '.' as const, dialect: null };
    }
    // only the head of a large file: cut at the last line break, so no row is read half
    if (large) buf = buf.subarray(0, buf.lastIndexOf(0x0a) + 1);
    const t = await readDelimited(buf, { fileName: file.filename });
    return { kind: 'text' as const, partial: large, sheets: [], table: t as CellTable, header: t.header, metadata: t.metadata, warnings: t.warnings, decimal: t.dialect.decimal, dialect: t.dialect };
  } catch (e) {
    if (e instanceof ImportError) throw new DomainError('invalid', 'unreadable', e.message);
    throw e;
  }
}

const rowsView = (r: TrialSheetResult, limit = 500) => ({
  okCount: r.okCount,
  errorCount: r.errorCount,
  warningCount: r.warningCount,
  notices: r.notices,
  issues: r.rows.flatMap((x) => x.issues).slice(0, limit),
  preview: r.rows.slice(0, 8).map((x) => (x.ok ? { line: x.line, ok: true, row: x.row } : { line: x.line, ok: false })),
  hottest: hottestRows(r),
});

/** The hottest inlet and outlet of the rows that can be imported (°C, with the outlet's line), for the cautions of the check. */
function hottestRows(r: TrialSheetResult): { inletTempC: number | null; outletTempC: number | null; outletLine: number | null } {
  let inletTempC: number | null = null, outletTempC: number | null = null, outletLine: number | null = null;
  for (const x of r.rows) {
    if (!x.ok) continue;
    if (inletTempC === null || x.row.inletTempC > inletTempC) inletTempC = x.row.inletTempC;
    if (outletTempC === null || x.row.outletTempC > outletTempC) { outletTempC = x.row.outletTempC; outletLine = x.line; }
  }
  return { inletTempC, outletTempC, outletLine };
}

const logHeadView = (log: SensorLog) => ({
  accepted: log.n,
  rejected: log.rejectedCount,
  issues: log.issues.slice(0, 20),
  notices: log.notices,
  rows: Array.from({ length: Math.min(8, log.n) }, (_, i) => ({
    line: log.lines[i], timeS: log.timeS[i], inletTempC: log.inletTempC[i], outletTempC: log.outletTempC[i], flowM3PerS: log.flowM3PerS[i],
    ambientTempC: log.ambientTempC ? log.ambientTempC[i] : null,
  })),
});

/**
 * What the mapping screen shows: sheets, header, metadata, the suggested (or saved) mapping, the
 * shape of data the file seems to hold, and the check of every row (trial sheets) or of the first
 * rows (sensor logs, which are checked whole when their steady periods are found). Files over the
 * inline limit are read only from their head here.
 */
export async function previewImport(em: EntityManager, lab: LabRow, file: SourceFileRow, opts: { sheet?: string; mapping?: unknown }) {
  const t = await readTable(file, opts.sheet, { headOnly: true });
  const signature = headerSignature(t.header);
  const saved = await em.findOne(ColumnMapping, { lab, headerSignature: signature });
  const head = t.table.rows.slice(0, 400) as (string | number | null)[][];
  const suggestion = suggestMapping(t.header, head.slice(0, 50), t.decimal);
  const shape = t.kind === 'xlsx'
    ? { shape: 'trialSheet' as const, reason: 'Workbooks are read as trial sheets; save a logger dump as CSV to import it as a sensor log.', medianIntervalS: null }
    : suggestShape(suggestion, t.decimal, t.header, head, t.table.lines.slice(0, 400));
  const sheetMapping = {
    shape: 'trialSheet',
    decimal: t.decimal,
    columns: suggestion.columns.filter((c) => c.field).map((c) => ({ column: c.column, header: c.header, field: c.field, ...(c.unit ? { unit: c.unit } : {}) })),
    ...(suggestion.dateOrder === 'dmy' || suggestion.dateOrder === 'mdy' ? { dateOrder: suggestion.dateOrder } : {}),
  };
  const logMapping = logMappingFrom(suggestion, t.decimal);
  const mapping = opts.mapping ?? saved?.mapping ?? (shape.shape === 'sensorLog' && logMapping ? logMapping : sheetMapping);
  const isLog = (mapping as { shape?: unknown }).shape === 'sensorLog';
  let check: ReturnType<typeof rowsView> | null = null;
  let logHead: ReturnType<typeof logHeadView> | null = null;
  let mappingError: string | null = null;
  try {
    if (isLog) logHead = logHeadView(readLogHead(mapping, t.header, head, t.table.lines.slice(0, 400)));
    else if (!t.partial) check = rowsView(importTrialSheet(t.table, mapping, { file: file.filename, sheet: t.kind === 'xlsx' ? opts.sheet : undefined }));
    else mappingError = `"${file.filename}" is over ${INLINE_MAX_BYTES / 1024 / 1024} MB: files this large are imported as sensor logs.`;
  } catch (e) {
    if (!(e instanceof ImportError)) throw e;
    mappingError = e.message;
  }
  return {
    file: sourceFileDto(file),
    kind: t.kind,
    sheets: t.sheets,
    header: t.header,
    metadata: t.metadata,
    warnings: t.warnings,
    dialect: t.dialect,
    /** rows read; only those of the head when `partial` */
    rowCount: t.table.rows.length,
    partial: t.partial,
    suggestion,
    shape,
    alternatives: { trialSheet: sheetMapping, sensorLog: logMapping },
    savedMapping: !!saved,
    mapping,
    mappingError,
    check,
    logHead,
  };
}

export const confirmInput = z.object({ sheet: z.string().max(100).optional(), mapping: confirmedMappingSchema, excludedLines: z.array(z.number().int().positive()).max(100_000).default([]) }).strict();

/**
 * Writes the checked rows as trials in one transaction, each linked to its file and line; any
 * error in a row that is not excluded refuses the whole import and nothing is written.
 */
export async function confirmImport(em: EntityManager, rig: RigRow, file: SourceFileRow, input: z.infer<typeof confirmInput>) {
  if (file.state === 'imported') throw new DomainError('conflict', 'already_imported', `"${file.filename}" has already been imported into this lab (${file.rowsImported} trials).`);
  if (input.mapping.shape !== 'trialSheet') throw new DomainError('invalid', 'wrong_shape', 'This mapping is for a sensor log: find its steady periods and import it as a log.');
  const t = await readTable(file, input.sheet);
  let result: TrialSheetResult;
  try {
    result = importTrialSheet(t.table, input.mapping, { file: file.filename, sheet: input.sheet });
  } catch (e) {
    if (e instanceof ImportError) throw new DomainError('invalid', 'bad_mapping', e.message);
    throw e;
  }
  const skip = new Set(input.excludedLines);
  const kept = result.rows.filter((r) => !skip.has(r.line));
  const bad = kept.filter((r) => !r.ok);
  if (bad.length) {
    throw new DomainError('invalid', 'row_errors', `${bad.length} row(s) still have errors; fix them in the file or exclude them. Nothing was imported.`, {
      issues: bad.flatMap((r) => r.issues).slice(0, 200),
    });
  }
  if (!kept.length) throw new DomainError('invalid', 'nothing', 'Every row is excluded: there is nothing to import.');
  const fallback = file.createdAt.getTime();
  const n = await em.transactional(async (tx) => {
    for (const r of kept) {
      if (!r.ok) continue;
      const row = r.row;
      const startedAt = row.time?.kind === 'datetime' ? new Date(row.time.iso) : row.time?.kind === 'elapsed' ? new Date(fallback + row.time.seconds * 1000) : new Date(fallback + r.line * 1000);
      tx.create(Trial, { lab: rig.lab, rig, origin: 'sheet', sourceFile: file, sourceLine: r.line, ...trialFields(row, startedAt) });
    }
    await keepMapping(tx, rig.lab, t.header, input.mapping);
    tx.assign(file, { state: 'imported', rowsImported: kept.length, rig });
    return kept.length;
  });
  return { imported: n, warnings: result.warningCount };
}

/** Keeps a confirmed mapping for the lab's next file with these headers (one per header signature); the caller flushes. */
async function keepMapping(em: EntityManager, lab: LabRow, header: string[], mapping: unknown) {
  const signature = headerSignature(header);
  const saved = await em.findOne(ColumnMapping, { lab, headerSignature: signature });
  if (saved) saved.mapping = mapping as Record<string, unknown>;
  else em.create(ColumnMapping, { lab, headerSignature: signature, headers: header, mapping: mapping as Record<string, unknown> });
}

/** Keeps a sensor-log mapping for the next file with the same headers. */
export async function saveLogMapping(em: EntityManager, lab: LabRow, file: SourceFileRow, mapping: unknown) {
  await keepMapping(em, lab, (await readTable(file, undefined, { headOnly: true })).header, mapping);
  await em.flush();
}

export async function loadFile(em: EntityManager, rig: RigRow, fileId: string) {
  const file = isUuid(fileId) ? await em.findOne(SourceFile, { id: fileId, lab: rig.lab }) : null;
  if (!file) throw new DomainError('not_found', 'not_found', 'No such upload in this lab.');
  return file;
}
