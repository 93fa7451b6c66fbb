/**
 * (Server-side: Node APIs. The 'server-only' marker sits in ./index.ts, the entry the app imports;
 * vitest cannot resolve it in leaf files until its alias in vitest.config.mts points at a file path.)
 *
 * Zip-bomb guard for XLSX uploads, run before exceljs sees the bytes. exceljs 4.4 reads a
 * workbook buffer with JSZip (`xlsx.load`), which inflates every entry in full and trusts the
 * sizes written in the archive; JSZip's public API does not expose those sizes either. So this
 * reads the central directory itself (PKWARE APPNOTE 6.3.x §4.3.12–4.3.16), refuses archives
 * whose declared sizes or ratios are over the limits, and then inflates each entry with zlib
 * capped at its declared size (a lying header fails there), never holding more than one entry.
 */
import { inflateRawSync } from 'node:zlib';
import { formatBytes } from './decode-text';
import { ImportError } from './import-error';

export interface ZipLimits {
  /** sum of the uncompressed sizes (default 50 MB: about half a million sheet cells) */
  maxUncompressedBytes: number;
  /** uncompressed ÷ compressed for any entry over 1 MB (default 200; sheet XML is typically 5–50) */
  maxRatio: number;
  /** number of entries (default 2000) */
  maxEntries: number;
}

export const DEFAULT_ZIP_LIMITS: ZipLimits = { maxUncompressedBytes: 50e6, maxRatio: 200, maxEntries: 2000 };

export interface ZipEntryInfo {
  name: string;
  method: number;
  compressedSize: number;
  uncompressedSize: number;
}

/** Lists the entries of a zip archive from its central directory, without inflating anything. */
export function listZipEntries(buf: Uint8Array, file?: string): ZipEntryInfo[] {
  const dv = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
  const notZip = () => new ImportError('not_xlsx', 'this is not an XLSX workbook (no zip directory found); save it again as .xlsx', { file });
  if (buf.length < 22 || dv.getUint32(0, true) !== 0x04034b50) throw notZip();
  let eocd = -1;
  for (let i = buf.length - 22; i >= Math.max(0, buf.length - 22 - 65535); i--) {
    if (dv.getUint32(i, true) === 0x06054b50) { eocd = i; break; }
  }
  if (eocd < 0) throw notZip();
  const count = dv.getUint16(eocd + 10, true);
  const cdSize = dv.getUint32(eocd + 12, true);
  const cdOffset = dv.getUint32(eocd + 16, true);
  if (count === 0xffff || cdOffset === 0xffffffff || cdSize === 0xffffffff) {
    throw new ImportError('zip_bomb', 'the workbook uses ZIP64 (over 4 GB or 65,535 parts), which is refused', { file });
  }
  if (cdOffset + cdSize > buf.length) throw notZip();
  const entries: ZipEntryInfo[] = [];
  let p = cdOffset;
  for (let k = 0; k < count; k++) {
    if (p + 46 > buf.length || dv.getUint32(p, true) !== 0x02014b50) throw notZip();
    const method = dv.getUint16(p + 10, true);
    const compressedSize = dv.getUint32(p + 20, true);
    const uncompressedSize = dv.getUint32(p + 24, true);
    const nameLen = dv.getUint16(p + 28, true);
    const extraLen = dv.getUint16(p + 30, true);
    const commentLen = dv.getUint16(p + 32, true);
    const name = new TextDecoder().decode(buf.subarray(p + 46, p + 46 + nameLen));
    entries.push({ name, method, compressedSize, uncompressedSize, localOffset: dv.getUint32(p + 42, true) } as ZipEntryInfo & { localOffset: number });
    p += 46 + nameLen + extraLen + commentLen;
  }
  return entries;
}

/**
 * Refuses a zip bomb: too many entries, too much declared data, an extreme ratio, or an entry
 * that inflates beyond what it declares.
 * @throws ImportError `zip_bomb` naming the entry, `not_xlsx` when it is not a zip at all.
 */
export function checkZip(buf: Uint8Array, limits: ZipLimits = DEFAULT_ZIP_LIMITS, file?: string): ZipEntryInfo[] {
  const entries = listZipEntries(buf, file);
  const bomb = (why: string) => new ImportError('zip_bomb', `refused as a possible zip bomb: ${why}`, { file });
  if (entries.length > limits.maxEntries) throw bomb(`${entries.length} parts (limit ${limits.maxEntries})`);
  let total = 0;
  for (const e of entries) {
    total += e.uncompressedSize;
    if (total > limits.maxUncompressedBytes) throw bomb(`it unpacks to more than ${formatBytes(limits.maxUncompressedBytes)} (at part "${e.name}")`);
    if (e.uncompressedSize > 1e6 && e.uncompressedSize > limits.maxRatio * Math.max(1, e.compressedSize)) {
      throw bomb(`part "${e.name}" unpacks ${Math.round(e.uncompressedSize / Math.max(1, e.compressedSize))}× (limit ${limits.maxRatio}×)`);
    }
  }
  const dv = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
  for (const e of entries as (ZipEntryInfo & { localOffset: number })[]) {
    if (e.method === 0) continue;
    if (e.method !== 8) throw new ImportError('not_xlsx', `part "${e.name}" uses compression method ${e.method}, which XLSX does not use`, { file });
    const lo = e.localOffset;
    if (lo + 30 > buf.length || dv.getUint32(lo, true) !== 0x04034b50) throw new ImportError('not_xlsx', `the archive is damaged at part "${e.name}"`, { file });
    const start = lo + 30 + dv.getUint16(lo + 26, true) + dv.getUint16(lo + 28, true);
    try {
      const out = inflateRawSync(buf.subarray(start, start + e.compressedSize), { maxOutputLength: Math.max(1, e.uncompressedSize) });
      if (out.length !== e.uncompressedSize) throw bomb(`part "${e.name}" unpacks to ${out.length} bytes, not the ${e.uncompressedSize} it declares`);
    } catch (err) {
      if (err instanceof ImportError) throw err;
      if ((err as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE') throw bomb(`part "${e.name}" unpacks to more than the ${e.uncompressedSize} bytes it declares`);
      throw new ImportError('not_xlsx', `the archive is damaged at part "${e.name}" (${(err as Error).message})`, { file });
    }
  }
  return entries;
}
