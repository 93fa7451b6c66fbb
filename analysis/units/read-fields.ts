/**
 * Reading fields of untrusted JSON input (the command line, imported files) into SI numbers.
 * Each reader names the field path in its error; none does I/O.
 */
import { describeValue } from './guards';
import { parseQuantity, type QuantityKind } from './parse-quantity';

/** A JSON object, as read. */
export type Fields = Record<string, unknown>;

/**
 * Requires a plain object.
 * @throws TypeError naming `path`.
 * @example asObject(JSON.parse('{"a":1}'), 'input')
 */
export function asObject(value: unknown, path: string): Fields {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    throw new TypeError(`${path} must be an object, got ${describeValue(value)}`);
  }
  return value as Fields;
}

/**
 * A required quantity string converted to SI (see parseQuantity).
 * @throws TypeError / RangeError naming `path.key`.
 * @example quantity({ depth: '5 ft' }, 'depth', 'length') // 1.524
 */
export function quantity(o: Fields, key: string, kind: QuantityKind, path = ''): number {
  const name = path ? `${path}.${key}` : key;
  if (!(key in o) || o[key] === undefined) throw new RangeError(`${name} is required (a quantity with a unit)`);
  return parseQuantity(o[key], kind, name);
}

/**
 * An optional quantity string converted to SI; undefined when absent.
 * @example optionalQuantity({}, 'wind', 'speed') // undefined
 */
export function optionalQuantity(o: Fields, key: string, kind: QuantityKind, path = ''): number | undefined {
  return o[key] === undefined ? undefined : quantity(o, key, kind, path);
}

/**
 * A plain number (for dimensionless inputs), optional with a default.
 * @throws TypeError naming the field when present and not a finite number.
 * @example plainNumber({ k: 2 }, 'k') // 2
 */
export function plainNumber(o: Fields, key: string, path = '', fallback?: number): number | undefined {
  const name = path ? `${path}.${key}` : key;
  const v = o[key];
  if (v === undefined) return fallback;
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new TypeError(`${name} must be a number, got ${describeValue(v)}`);
  return v;
}

/** One field as the user wrote it, and the name the analysis functions give it. */
export interface FieldRead {
  /** the user's path, e.g. `losses.weather[3].airTemp` */
  path: string;
  /** what the user wrote, e.g. `"-6 ft"` */
  text: unknown;
  /** the SI value read from it */
  value: number;
  /** the analysis function's field name for it, e.g. `weather[3].airTempC` */
  as: string;
}

const escapeRegExp = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * Rewrites an analysis message in the user's words: every field the reader recorded is named as
 * the user wrote it, and its value, where the message echoes it (`field (v)` or `field … got v`),
 * is shown as the user wrote it, in the user's unit.
 * @example inUserWords('deepDepthM must be greater than 0, got -1.8288', [{ path: 'deepDepth', text: '-6 ft', value: -1.8288, as: 'deepDepthM' }])
 *   // 'deepDepth must be greater than 0, got "-6 ft"'
 */
export function inUserWords(message: string, reads: readonly FieldRead[]): string {
  let out = message;
  // longest names first, so `losses.walls.areaM2` is rewritten before `areaM2`
  for (const r of [...reads].sort((a, b) => b.as.length - a.as.length)) {
    if (r.as === r.path && (typeof r.text === 'number' || r.text === undefined)) continue;
    const name = new RegExp(`(?<![\\w.\\]\\[])${escapeRegExp(r.as)}(?![\\w\\[])`, 'g');
    if (!name.test(out)) continue;
    if (!Number.isFinite(r.value)) { out = out.replace(name, r.path); continue; }
    const shown = describeValue(r.text);
    const v = escapeRegExp(String(r.value));
    out = out
      .replace(new RegExp(`(?<![\\w.\\]\\[])${escapeRegExp(r.as)} \\(${v}\\)`, 'g'), `${r.path} (${shown})`)
      .replace(new RegExp(`^${escapeRegExp(r.as)}( [^]*?got )${v}(?![\\d.e])`), `${r.path}$1${shown}`)
      .replace(name, r.path);
  }
  return out;
}

/**
 * Reads fields like the free functions above and remembers, for each, the user's path and text
 * and the analysis name of the value (`as`), so that a message an analysis function throws about
 * `deepDepthM` can be told back as the user wrote it (`deepDepth … got "-6 ft"`): see
 * {@link inUserWords}. One reader per command run.
 * @example const read = fieldReader(); read.quantity(o, 'deepDepth', 'length', { as: 'deepDepthM' })
 */
export function fieldReader() {
  const reads: FieldRead[] = [];
  const full = (key: string, path: string) => (path ? `${path}.${key}` : key);
  const reader = {
    reads: reads as readonly FieldRead[],
    asObject,
    /** a required quantity (see {@link quantity}); `as` is the analysis name of the value (default the user's path) */
    quantity(o: Fields, key: string, kind: QuantityKind, opts: { path?: string; as?: string } = {}): number {
      const value = quantity(o, key, kind, opts.path ?? '');
      reads.push({ path: full(key, opts.path ?? ''), text: o[key], value, as: opts.as ?? full(key, opts.path ?? '') });
      return value;
    },
    /** an optional quantity, undefined when absent (its name is still told back in the user's words) */
    optionalQuantity(o: Fields, key: string, kind: QuantityKind, opts: { path?: string; as?: string } = {}): number | undefined {
      if (o[key] !== undefined) return reader.quantity(o, key, kind, opts);
      reads.push({ path: full(key, opts.path ?? ''), text: undefined, value: Number.NaN, as: opts.as ?? full(key, opts.path ?? '') });
      return undefined;
    },
    /** a plain number (see {@link plainNumber}) */
    plainNumber(o: Fields, key: string, opts: { path?: string; as?: string; fallback?: number } = {}): number | undefined {
      const value = plainNumber(o, key, opts.path ?? '', opts.fallback);
      reads.push({ path: full(key, opts.path ?? ''), text: o[key], value: o[key] === undefined ? Number.NaN : (value as number), as: opts.as ?? full(key, opts.path ?? '') });
      return value;
    },
    /** records a value read some other way (an array element, a derived value) */
    record(path: string, text: unknown, value: number, as: string): void {
      reads.push({ path, text, value, as });
    },
    /** the message in the user's words */
    translate(message: string): string {
      return inUserWords(message, reads);
    },
    /** the user's path of the field a message (in the user's words) begins with, if one was read */
    fieldOf(message: string): string | undefined {
      return [...reads].sort((a, b) => b.path.length - a.path.length).find((r) => message.startsWith(r.path) && !/[\w[]/.test(message[r.path.length] ?? ' '))?.path;
    },
  };
  return reader;
}

/** A reader from {@link fieldReader}. */
export type FieldReader = ReturnType<typeof fieldReader>;
