/**
 * Argument guards shared by the heater, pool and money models. The policy (STYLE.md §10):
 * a non-number or non-finite value throws `TypeError`, a number outside its domain throws
 * `RangeError`; both messages name the field and echo the bad value, so NaN never escapes.
 */

function show(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value);
  if (typeof value === 'number' || typeof value === 'boolean' || value == null) return String(value);
  try {
    return JSON.stringify(value) ?? String(value);
  } catch {
    return String(value);
  }
}

/**
 * Requires a finite number.
 * @throws TypeError when `value` is not a finite number (NaN, ±Infinity, a string…).
 * @example requireFinite(3, 'flowM3PerS') // 3
 */
export function requireFinite(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new TypeError(`${field} must be a finite number, got ${show(value)}`);
  }
  return value;
}

/**
 * Requires a finite number > 0.
 * @throws TypeError when not finite; RangeError when ≤ 0.
 * @example requirePositive(0.2, 'massFlowKgPerS')
 */
export function requirePositive(value: unknown, field: string): number {
  const v = requireFinite(value, field);
  if (!(v > 0)) throw new RangeError(`${field} must be greater than 0, got ${show(value)}`);
  return v;
}

/**
 * Requires a finite number ≥ 0.
 * @throws TypeError when not finite; RangeError when < 0.
 * @example requireNonNegative(0, 'windMPerS')
 */
export function requireNonNegative(value: unknown, field: string): number {
  const v = requireFinite(value, field);
  if (!(v >= 0)) throw new RangeError(`${field} must be 0 or more, got ${show(value)}`);
  return v;
}

/**
 * Requires a finite number in the closed interval [min, max].
 * @throws TypeError when not finite; RangeError when outside the interval.
 * @example requireInRange(0.5, 'relativeHumidity', 0, 1)
 */
export function requireInRange(value: unknown, field: string, min: number, max: number): number {
  const v = requireFinite(value, field);
  if (!(v >= min && v <= max)) {
    throw new RangeError(`${field} must be between ${min} and ${max}, got ${show(value)}`);
  }
  return v;
}

/**
 * Requires a non-empty array of finite numbers.
 * @throws TypeError when not an array or an element is not finite; RangeError when empty.
 * @example requireFiniteArray([79.8, 80.4], 'fillTimesS')
 */
export function requireFiniteArray(value: unknown, field: string): number[] {
  if (!Array.isArray(value) && !(value instanceof Float64Array)) {
    throw new TypeError(`${field} must be an array of numbers, got ${show(value)}`);
  }
  const arr = Array.from(value as ArrayLike<unknown>);
  if (arr.length === 0) throw new RangeError(`${field} must not be empty`);
  arr.forEach((x, i) => requireFinite(x, `${field}[${i}]`));
  return arr as number[];
}

/**
 * The path of the first NaN or ±Infinity in a plain-data value (numbers, arrays, typed arrays,
 * objects), or null when every number is finite: the one check that no result carries a number
 * JSON would print as null.
 * @example firstNonFinitePath({ a: [1, Infinity] }, 'result') // 'result.a[1]'
 */
export function firstNonFinitePath(value: unknown, path: string): string | null {
  // the common answer (all finite) without building a path string for every number of the value
  return allFinite(value) ? null : pathOfNonFinite(value, path);
}

/** Whether every number in a plain-data value is finite (the same walk as {@link pathOfNonFinite}). */
function allFinite(value: unknown): boolean {
  if (typeof value === 'number') return Number.isFinite(value);
  if (Array.isArray(value) || ArrayBuffer.isView(value)) {
    const a = value as ArrayLike<unknown>;
    for (let i = 0; i < a.length; i++) if (!allFinite(a[i])) return false;
    return true;
  }
  if (value && typeof value === 'object') {
    for (const k in value) if (Object.prototype.hasOwnProperty.call(value, k) && !allFinite((value as Record<string, unknown>)[k])) return false;
  }
  return true;
}

function pathOfNonFinite(value: unknown, path: string): string | null {
  if (typeof value === 'number') return Number.isFinite(value) ? null : path;
  if (Array.isArray(value) || ArrayBuffer.isView(value)) {
    const a = value as ArrayLike<unknown>;
    for (let i = 0; i < a.length; i++) {
      const r = pathOfNonFinite(a[i], `${path}[${i}]`);
      if (r) return r;
    }
    return null;
  }
  if (value && typeof value === 'object') {
    for (const [k, w] of Object.entries(value)) {
      const r = pathOfNonFinite(w, `${path}.${k}`);
      if (r) return r;
    }
  }
  return null;
}

/** Echo helper for error messages elsewhere in analysis/. */
export const describeValue = show;
