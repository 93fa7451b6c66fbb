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
 * @example quantity({ depth: '4 ft' }, 'depth', 'length') // 1.2192
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

/** Converts typed arrays to plain arrays for JSON output. */
export function toArray(a: ArrayLike<number>): number[] {
  return Array.from(a);
}
