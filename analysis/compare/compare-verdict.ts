/**
 * The plain-words verdicts of a design comparison, in our own wording: a difference is claimed only
 * when its interval excludes zero, with the interval's ends rounded outwards (so the words never
 * claim more than the data show); otherwise "no difference the data can show".
 */
import { fromSI } from '../units/parse-quantity';

/** An interval to put into words. */
export interface Bounds { value: number; ciLow: number; ciHigh: number }

/** Rounds outwards at one decimal below 10, whole numbers above. */
function span(lo: number, hi: number): [string, string] {
  const digits = Math.max(Math.abs(lo), Math.abs(hi)) < 10 ? 1 : 0;
  const f = 10 ** digits;
  return [(Math.floor(lo * f) / f).toFixed(digits), (Math.ceil(hi * f) / f).toFixed(digits)];
}

const signed = (s: string) => (s.startsWith('-') ? `−${s.slice(1)}` : `+${s}`);

/**
 * The flow in the verdict's unit, three significant figures.
 * @throws RangeError for a unit that is not a volume flow
 * @example flowWords(1.6667e-4, 'L/min') // '10 L/min'
 */
export function flowWords(flowM3PerS: number, unit: string): string {
  return `${Number(fromSI(flowM3PerS, 'volumeFlow', unit).toPrecision(3))} ${unit}`;
}

/**
 * "B delivers 14–19 % more heat at 10 L/min than A", or less, or no difference the data can show.
 * @param labels the two designs' names [A, B]
 * @param d the percentage difference 100·(q_B/q_A − 1) with its interval
 * @param flowM3PerS the flow compared, m³/s
 * @param unit unit for the flow in words (e.g. 'L/min', 'gpm')
 * @param extrapolated add that the flow lies outside the tested flows
 * @example heatVerdict(['A', 'B'], { value: 16, ciLow: 14.2, ciHigh: 18.4 }, 1.6667e-4, 'L/min', false) // 'B delivers 14–19 % more heat at 10 L/min than A.'
 */
export function heatVerdict(labels: [string, string], d: Bounds, flowM3PerS: number, unit: string, extrapolated: boolean): string {
  const [A, B] = labels;
  const at = flowWords(flowM3PerS, unit);
  let s: string;
  if (d.ciLow > 0) {
    const [lo, hi] = span(d.ciLow, d.ciHigh);
    s = `${B} delivers ${lo}–${hi} % more heat at ${at} than ${A}.`;
  } else if (d.ciHigh < 0) {
    const [lo, hi] = span(-d.ciHigh, -d.ciLow);
    s = `${B} delivers ${lo}–${hi} % less heat at ${at} than ${A}.`;
  } else {
    const [lo, hi] = span(d.ciLow, d.ciHigh);
    s = `At ${at} there is no difference the data can show between the heat ${A} and ${B} deliver (${B} against ${A}: ${signed(lo)} % to ${signed(hi)} %).`;
  }
  return extrapolated ? `${s} This flow lies outside the tested flows of at least one design: treat it as an estimate.` : s;
}

/**
 * Sentences on the coil parameters: the UA ratio and the source-temperature difference.
 * @example parameterStatements(['A', 'B'], { value: 1.1, ciLow: 1.05, ciHigh: 1.15 }, { value: 2, ciLow: -1, ciHigh: 5 })
 */
export function parameterStatements(labels: [string, string], uaRatio: Bounds, tsDifferenceK: Bounds): string[] {
  const [A, B] = labels;
  const r = (v: number) => v.toFixed(3);
  const ua = uaRatio.ciLow > 1 || uaRatio.ciHigh < 1
    ? `The conductance UA of ${B} is ${r(uaRatio.value)} times that of ${A} (${r(uaRatio.ciLow)} to ${r(uaRatio.ciHigh)}).`
    : `The data show no difference in conductance UA between ${A} and ${B} (ratio ${r(uaRatio.value)}, ${r(uaRatio.ciLow)} to ${r(uaRatio.ciHigh)}).`;
  const k = (v: number) => signed(v.toFixed(1));
  const ts = tsDifferenceK.ciLow > 0 || tsDifferenceK.ciHigh < 0
    ? `The source temperature of ${B} differs from that of ${A} by ${k(tsDifferenceK.value)} K (${k(tsDifferenceK.ciLow)} to ${k(tsDifferenceK.ciHigh)} K).`
    : `The data show no difference in source temperature between ${A} and ${B} (${k(tsDifferenceK.ciLow)} to ${k(tsDifferenceK.ciHigh)} K).`;
  return [ua, ts];
}
