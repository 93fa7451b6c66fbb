/**
 * The command line's one check that a result is all finite numbers: a value that overflows
 * double precision (a price of 1e300 $, a UA of 1e308 W/K) would print as null with exit 0.
 * The message names the result field and the inputs whose magnitude is extreme, which are the
 * likely cause.
 */
import { firstNonFinitePath } from '../units/guards';

/** Inputs at least this large in magnitude are named as likely causes (our threshold). */
const EXTREME = 1e15;

/** Leading number of a quantity string such as "1e308 W/K". */
const LEADING_NUMBER = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?)/i;

function extremeInputs(v: unknown, path: string, out: string[]): void {
  if (out.length >= 3) return;
  if (typeof v === 'number') {
    if (!(Math.abs(v) < EXTREME)) out.push(`${path} (${v})`);
  } else if (typeof v === 'string') {
    const m = LEADING_NUMBER.exec(v);
    if (m && !(Math.abs(Number(m[1])) < EXTREME)) out.push(`${path} (${JSON.stringify(v)})`);
  } else if (Array.isArray(v)) {
    v.forEach((w, i) => extremeInputs(w, `${path}[${i}]`, out));
  } else if (v && typeof v === 'object') {
    for (const [k, w] of Object.entries(v)) extremeInputs(w, path ? `${path}.${k}` : k, out);
  }
}

/**
 * @param result what a command returned
 * @param input the parsed input it was given
 * @returns null when every number in `result` is finite, else a message naming the first
 *   non-finite field and the inputs with extreme magnitudes
 * @example nonFiniteResultMessage({ heatCeiling_W: Infinity }, { UA: '1e308 W/K' }) // 'the result field heatCeiling_W is not a finite number …: UA ("1e308 W/K")'
 */
export function nonFiniteResultMessage(result: unknown, input: unknown): string | null {
  const path = firstNonFinitePath(result, '');
  if (path === null) return null;
  const field = path.replace(/^\./, '') || 'result';
  const causes: string[] = [];
  extremeInputs(input, '', causes);
  const why = causes.length
    ? `; inputs beyond what the model and double precision hold: ${causes.join(', ')}`
    : '; check the magnitudes of the inputs';
  return `the result field ${field} is not a finite number (an input is too large for the calculation)${why}`;
}
