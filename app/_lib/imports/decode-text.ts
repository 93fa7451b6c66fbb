/**
 * Bytes → text for delimited files, refusing what is not text. Streams: the caller feeds byte
 * chunks and gets text chunks back, so a 60 MB log is never held as one string.
 *
 * Policy: a UTF-8 or UTF-16 byte-order mark decides the encoding. Without one, the first chunk
 * decides: NUL bytes or other control characters mean a binary file (a workbook, a PDF, an image
 * renamed .csv) and are refused; valid UTF-8 is read as UTF-8 (a later invalid byte is refused
 * with its byte offset); otherwise, in `auto` mode, text without control characters is read as
 * Windows-1252 (what spreadsheet programs on Windows save as "CSV") and a warning says so.
 */
import { ImportError } from './import-error';

export type TextEncoding = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

export interface DecodeOptions {
  /** `auto` (default) or a fixed encoding */
  encoding?: 'auto' | TextEncoding;
  /** shown in error messages */
  fileName?: string;
  /** refuse after this many bytes (default: no limit) */
  maxBytes?: number;
}

export interface DecodedText {
  encoding: TextEncoding;
  bom: boolean;
  warnings: string[];
  /** text chunks in order; the BOM is removed */
  chunks: AsyncGenerator<string, void, undefined>;
}

const ZIP_MAGIC = [0x50, 0x4b, 0x03, 0x04];

function controlCharCount(bytes: Uint8Array, limit: number): { nul: number; other: number; at: number } {
  let nul = 0, other = 0, firstNul = -1, firstOther = -1;
  const n = Math.min(bytes.length, limit);
  for (let i = 0; i < n; i++) {
    const b = bytes[i];
    if (b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0d && b !== 0x0c) {
      if (b === 0) { nul++; if (firstNul < 0) firstNul = i; }
      else { other++; if (firstOther < 0) firstOther = i; }
    }
  }
  return { nul, other, at: nul > 0 ? firstNul : firstOther };
}

function isValidUtf8(bytes: Uint8Array, atEnd: boolean): boolean {
  try {
    // stream: true lets a multi-byte character cut at the chunk's end pass
    new TextDecoder('utf-8', { fatal: true }).decode(bytes, { stream: !atEnd });
    return true;
  } catch {
    return false;
  }
}

async function* toByteChunks(input: AsyncIterable<Uint8Array | string> | Uint8Array | string): AsyncGenerator<Uint8Array> {
  if (typeof input === 'string') {
    yield new TextEncoder().encode(input);
    return;
  }
  if (input instanceof Uint8Array) {
    yield input;
    return;
  }
  for await (const c of input) yield typeof c === 'string' ? new TextEncoder().encode(c) : c;
}

/**
 * Opens a byte source as text. Reads the first chunk (at least 64 KiB when the source gives
 * smaller pieces) to decide the encoding.
 * @throws ImportError `empty_file`, `binary_file`, `invalid_encoding`, `too_large`
 * @example const t = await decodeText(fs.createReadStream(p), { fileName: 'log.csv' })
 */
export async function decodeText(
  input: AsyncIterable<Uint8Array | string> | Uint8Array | string,
  options: DecodeOptions = {},
): Promise<DecodedText> {
  const file = options.fileName;
  const maxBytes = options.maxBytes ?? Infinity;
  const source = toByteChunks(input);
  let total = 0;
  const pending: Uint8Array[] = [];
  let ended = false;
  const pull = async (): Promise<Uint8Array | null> => {
    const r = await source.next();
    if (r.done) return null;
    total += r.value.length;
    if (total > maxBytes) {
      throw new ImportError('too_large', `the file is larger than the limit of ${formatBytes(maxBytes)}; reading stopped there`, { file });
    }
    return r.value;
  };
  // Gather a head of at least 64 KiB for the decision.
  let headLen = 0;
  while (headLen < 65536) {
    const c = await pull();
    if (c === null) { ended = true; break; }
    if (c.length === 0) continue;
    pending.push(c);
    headLen += c.length;
  }
  const head = concat(pending);
  if (head.length === 0) throw new ImportError('empty_file', 'the file is empty (0 bytes)', { file });

  let encoding: TextEncoding;
  let bomLen = 0;
  if (head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf) { encoding = 'utf-8'; bomLen = 3; }
  else if (head[0] === 0xff && head[1] === 0xfe) { encoding = 'utf-16le'; bomLen = 2; }
  else if (head[0] === 0xfe && head[1] === 0xff) { encoding = 'utf-16be'; bomLen = 2; }
  else {
    if (ZIP_MAGIC.every((b, i) => head[i] === b)) {
      throw new ImportError('binary_file', 'this is a zip archive (perhaps an XLSX workbook), not delimited text; upload it with the .xlsx extension', { file });
    }
    const cc = controlCharCount(head, 65536);
    if (cc.nul > 0 || cc.other > 2) {
      throw new ImportError('binary_file', `this is not a text file: it holds ${cc.nul > 0 ? 'NUL bytes' : 'control characters'} (first at byte ${cc.at + 1}); export the data as CSV or XLSX`, { file });
    }
    const requested = options.encoding ?? 'auto';
    if (requested !== 'auto') encoding = requested;
    else encoding = isValidUtf8(head, ended) ? 'utf-8' : 'windows-1252';
  }
  const warnings: string[] = [];
  if (encoding === 'windows-1252' && (options.encoding ?? 'auto') === 'auto') {
    warnings.push('the file is not UTF-8; it was read as Windows-1252 (check characters such as ° and ü in the preview)');
  }

  const decoder = new TextDecoder(encoding, { fatal: true });
  let offset = 0; // bytes decoded so far, for error messages
  const decode = (bytes: Uint8Array, last: boolean): string => {
    try {
      const s = decoder.decode(bytes, { stream: !last });
      offset += bytes.length;
      return s;
    } catch {
      throw new ImportError('invalid_encoding', `the file is not valid ${encoding} text (bad byte sequence between bytes ${offset + 1} and ${offset + bytes.length}); save it again as UTF-8 CSV`, { file });
    }
  };
  const checkBinary = (bytes: Uint8Array) => {
    if (encoding.startsWith('utf-16')) return;
    const i = bytes.indexOf(0);
    if (i >= 0) throw new ImportError('binary_file', `the file holds a NUL byte at byte ${offset + i + 1}; it is not a text file`, { file });
  };

  async function* chunks(): AsyncGenerator<string, void, undefined> {
    let first = bomLen > 0 ? head.subarray(bomLen) : head;
    offset = bomLen;
    checkBinary(first);
    let s = decode(first, ended);
    if (s) yield s;
    first = new Uint8Array(0);
    if (ended) return;
    for (;;) {
      const c = await pull();
      if (c === null) {
        const tail = decode(new Uint8Array(0), true);
        if (tail) yield tail;
        return;
      }
      checkBinary(c);
      s = decode(c, false);
      if (s) yield s;
    }
  }
  return { encoding, bom: bomLen > 0, warnings, chunks: chunks() };
}

function concat(parts: Uint8Array[]): Uint8Array {
  if (parts.length === 1) return parts[0];
  const n = parts.reduce((a, p) => a + p.length, 0);
  const out = new Uint8Array(n);
  let o = 0;
  for (const p of parts) { out.set(p, o); o += p.length; }
  return out;
}

/** "100 MB", "64 KiB"-style sizes for messages (decimal MB, as upload limits are stated). */
export function formatBytes(n: number): string {
  if (n >= 1e6) return `${+(n / 1e6).toFixed(1)} MB`;
  if (n >= 1e3) return `${+(n / 1e3).toFixed(1)} kB`;
  return `${n} bytes`;
}
