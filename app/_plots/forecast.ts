/**
 * The pool forecast: water temperature against time with the target and the safety thresholds,
 * and the energy budget by term (gains positive, losses negative).
 */
import * as Plot from '@observablehq/plot';
import type { EnergyBudget, ForecastResult } from '@/analysis/forecast/recirculating-forecast';
import { CAUTION_THRESHOLDS_C, HAZARD_BANDS } from '@/analysis/safety/cautions';
import { baseOptions, COLORS, type PlotFigure } from './theme';
import { displayUnits, fmt, withUnit } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { sentences } from './words';

/** Everything forecastPlot draws, SI (°C, hours). */
export interface ForecastPlotInput {
  /** sample times, h from the start */
  timeH: ArrayLike<number>;
  /** pool temperature at those times, °C */
  poolC: ArrayLike<number>;
  /** heater outlet temperature at those times, °C (null to omit) */
  outletTempC: ArrayLike<number> | null;
  targetC: number | null;
  hoursToTarget: number | null;
  /** thresholds crossed, from the forecast's cautions (°C, with their level) */
  cautions: { thresholdC: number; level: 'info' | 'caution' | 'danger' | string; message: string }[];
  /** 'pool' or 'tub' (the 40 °C spa limit is always drawn for a tub) */
  water?: 'pool' | 'tub';
}

/**
 * Adapter from recirculatingForecast's result.
 * @param targetC - the target temperature given to the forecast, °C
 * @example forecastPlot(forecastInputFromResult(result, { targetC: 28 }), 'us')
 */
export function forecastInputFromResult(result: ForecastResult, options: { targetC?: number | null; showOutlet?: boolean; water?: 'pool' | 'tub' } = {}): ForecastPlotInput {
  return {
    timeH: result.timeH,
    poolC: result.tempC,
    outletTempC: options.showOutlet === false ? null : result.outletTempC,
    targetC: options.targetC ?? null,
    hoursToTarget: result.hoursToTarget,
    cautions: result.cautions.filter((c) => c.thresholdC !== null).map((c) => ({ thresholdC: c.thresholdC as number, level: c.level, message: c.message })),
    water: options.water,
  };
}

/** The caution lines, from the shared hazard bands (analysis/safety): their words, danger bands in red. */
const THRESHOLD_WORDS: { c: number; text: string; stroke: string }[] = [...HAZARD_BANDS].reverse()
  .map((b) => ({ c: b.thresholdC, text: b.short, stroke: b.level === 'danger' ? COLORS.danger : COLORS.caution }));
/**
 * Pool (or tub) temperature against time, in the user's units.
 * @example plotToSvg(forecastPlot(forecastInputFromResult(result, { targetC: 28 }), 'si').options)
 */
export function forecastPlot(input: ForecastPlotInput, units: UnitSystem, size: { width?: number; height?: number } = {}): PlotFigure {
  const u = displayUnits(units);
  const T = u.temp.from;
  const n = Math.min(input.timeH.length, input.poolC.length);
  const pool = Array.from({ length: n }, (_, i) => ({ t: input.timeH[i], y: T(input.poolC[i]) }));
  const outlet = input.outletTempC ? Array.from({ length: Math.min(n, input.outletTempC.length) }, (_, i) => ({ t: input.timeH[i], y: T((input.outletTempC as ArrayLike<number>)[i]) })) : [];
  const temps = [...Array.from({ length: n }, (_, i) => input.poolC[i]), ...(input.outletTempC ? Array.from(input.outletTempC).slice(0, n) : []), ...(input.targetC !== null ? [input.targetC] : [])].filter(Number.isFinite);
  const yLo = Math.min(...temps);
  const yHi = Math.max(...temps);
  const crossed = new Set(input.cautions.map((c) => c.thresholdC));
  const lines = THRESHOLD_WORDS.filter((w) => crossed.has(w.c) || (w.c >= yLo && w.c <= yHi) || (w.c === CAUTION_THRESHOLDS_C.spaLimit && input.water === 'tub'))
    .map((w) => ({ y: T(w.c), text: `${w.text} ${withUnit(w.c, u.temp)}`, stroke: w.stroke }));
  const hit = input.hoursToTarget;
  const first = n ? input.poolC[0] : NaN;
  const last = n ? input.poolC[n - 1] : NaN;
  const hours = n ? input.timeH[n - 1] : 0;

  const what = input.water === 'tub' ? 'tub' : 'pool';
  const poolEnd = pool[pool.length - 1]?.y, outletEnd = outlet[outlet.length - 1]?.y;
  const endsMeet = typeof poolEnd === 'number' && typeof outletEnd === 'number' && Math.abs(outletEnd - poolEnd) < 0.06 * Math.max(T(yHi) - T(yLo), 1e-9);
  const marks: Plot.Markish[] = [
    ...lines.flatMap((l) => [
      Plot.ruleY([l.y], { stroke: l.stroke, strokeDasharray: '6 3', strokeWidth: 1.25, ariaDescription: 'caution line' }),
      Plot.text([l], { y: 'y', text: 'text', fill: l.stroke, frameAnchor: 'left', textAnchor: 'start', dx: 4, dy: -7, ariaDescription: 'caution label' }),
    ]),
    ...(input.targetC !== null ? [
      Plot.ruleY([T(input.targetC)], { stroke: COLORS.water, strokeWidth: 1.5, ariaDescription: 'target line' }),
      Plot.text([T(input.targetC)], { y: (d: number) => d, text: () => `target ${withUnit(input.targetC as number, u.temp)}`, fill: COLORS.water, frameAnchor: 'right', textAnchor: 'end', dx: -4, dy: 12, ariaDescription: 'target label' }),
    ] : []),
    ...(hit !== null && input.targetC !== null ? [
      Plot.ruleX([hit], { stroke: COLORS.water, strokeDasharray: '3 3', ariaDescription: 'time to target line' }),
      Plot.dot([[hit, T(input.targetC)]], { r: 4.5, fill: COLORS.water, stroke: 'white', ariaDescription: 'time to target' }),
    ] : []),
    Plot.lineY(outlet, { x: 't', y: 'y', stroke: COLORS.heatLight, strokeWidth: 1.5, strokeDasharray: '5 3', ariaDescription: 'heater outlet' }),
    Plot.lineY(pool, { x: 't', y: 'y', stroke: COLORS.water, strokeWidth: 2.5, ariaDescription: 'water temperature' }),
    // the line labels at the end; when the heater is off there the two lines meet, so the water's label goes below its line
    Plot.text(outlet.slice(-1).map((d) => ({ ...d, label: 'heater outlet' })), { x: 't', y: 'y', text: 'label', fill: COLORS.heat, textAnchor: 'end', dy: -8, ariaDescription: 'line labels' }),
    Plot.text(pool.slice(-1).map((d) => ({ ...d, label: what })), { x: 't', y: 'y', text: 'label', fill: COLORS.water, textAnchor: 'end', dy: endsMeet ? 14 : -8, ariaDescription: 'line labels' }),
  ];
  const title = `${what === 'tub' ? 'Tub' : 'Pool'} temperature over ${fmt(hours, 3)} h`;
  const summary = sentences([
    n ? `the ${what} goes from ${withUnit(first, u.temp)} to ${withUnit(last, u.temp)} in ${fmt(hours, 3)} h` : 'no forecast samples',
    input.targetC !== null ? (hit !== null ? `it reaches the target ${withUnit(input.targetC, u.temp)} after ${fmt(hit, 3)} h` : `it does not reach the target ${withUnit(input.targetC, u.temp)} in this time`) : '',
    outlet.length ? `the dashed line is the heater outlet (highest ${withUnit(Math.max(...Array.from(input.outletTempC as ArrayLike<number>).slice(0, n)), u.temp)})` : '',
    lines.length ? `caution lines: ${lines.map((l) => l.text).join('; ')}` : '',
    ...input.cautions.filter((c) => c.level === 'danger').map((c) => c.message),
  ]);
  return {
    title,
    summary,
    options: {
      ...baseOptions({ ...size, ariaLabel: title, ariaDescription: summary }),
      x: { label: 'Time (h) →', grid: true, domain: [0, hours || 1] },
      y: { label: `↑ Temperature (${u.temp.label})`, grid: true },
      marks,
    },
  };
}

/** One term of the energy budget, J (gains positive, losses negative). */
export interface EnergyTerm {
  term: 'heater' | 'solar' | 'evaporation' | 'convection' | 'radiation' | 'conduction';
  energyJ: number;
}

/** Everything energyBudgetPlot draws, SI. */
export interface EnergyBudgetInput {
  terms: EnergyTerm[];
  /** change of stored energy, J */
  netJ: number;
  hours: number;
}

/**
 * Adapter from the forecast's energy budget (losses there are positive numbers; here they become negative).
 * @example energyBudgetPlot(energyBudgetInput(result.energy, 24), 'si')
 */
export function energyBudgetInput(energy: EnergyBudget, hours: number): EnergyBudgetInput {
  return {
    terms: [
      { term: 'heater', energyJ: energy.heaterJ },
      { term: 'solar', energyJ: energy.solarJ },
      { term: 'evaporation', energyJ: -energy.evaporationJ },
      { term: 'convection', energyJ: -energy.convectionJ },
      { term: 'radiation', energyJ: -energy.radiationJ },
      { term: 'conduction', energyJ: -energy.wallsJ },
    ],
    netJ: energy.netJ,
    hours,
  };
}

/**
 * The energy budget as horizontal bars, gains to the right and losses to the left, in kWh or therm.
 * @example plotToSvg(energyBudgetPlot(energyBudgetInput(result.energy, 24), 'us').options)
 */
export function energyBudgetPlot(input: EnergyBudgetInput, units: UnitSystem, size: { width?: number; height?: number } = {}): PlotFigure {
  const u = displayUnits(units);
  const E = u.energy.from;
  const rows = [...input.terms.map((t) => ({ term: t.term, v: E(t.energyJ), kind: t.energyJ >= 0 ? 'gain' : 'loss' })), { term: 'net change', v: E(input.netJ), kind: 'net' }];
  const fill = (k: string) => (k === 'gain' ? COLORS.heat : k === 'loss' ? COLORS.water : COLORS.inkSoft);
  const label = (v: number) => `${v > 0 ? '+' : ''}${fmt(v, 3)}`;
  const marks: Plot.Markish[] = [
    Plot.barX(rows, { y: 'term', x: 'v', fill: (d: { kind: string }) => fill(d.kind), title: (d: { term: string; v: number }) => `${d.term}: ${label(d.v)} ${u.energy.label}`, ariaDescription: 'energy terms' }),
    Plot.text(rows, { y: 'term', x: 'v', text: (d: { v: number }) => label(d.v), textAnchor: 'start', dx: 4, filter: (d: { v: number }) => d.v >= 0, fill: COLORS.ink, ariaDescription: 'energy labels' }),
    Plot.text(rows, { y: 'term', x: 'v', text: (d: { v: number }) => label(d.v), textAnchor: 'end', dx: -4, filter: (d: { v: number }) => d.v < 0, fill: COLORS.ink, ariaDescription: 'energy labels' }),
    Plot.ruleX([0], { stroke: COLORS.ink }),
  ];
  const gains = input.terms.filter((t) => t.energyJ > 0);
  const losses = input.terms.filter((t) => t.energyJ < 0).sort((a, b) => a.energyJ - b.energyJ);
  const title = `Energy budget over ${fmt(input.hours, 3)} h`;
  const summary = sentences([
    `gains: ${gains.length ? gains.map((t) => `${t.term} ${withUnit(t.energyJ, u.energy)}`).join(', ') : 'none'}`,
    `losses: ${losses.length ? losses.map((t) => `${t.term} ${withUnit(-t.energyJ, u.energy)}`).join(', ') : 'none'}`,
    losses.length ? `the largest loss is ${losses[0].term}` : '',
    `net change of stored energy ${withUnit(input.netJ, u.energy)}`,
  ]);
  const xs = rows.map((r) => r.v);
  const span = Math.max(...xs, 0) - Math.min(...xs, 0) || 1;
  return {
    title,
    summary,
    options: {
      ...baseOptions({ width: size.width, height: size.height ?? 260, ariaLabel: title, ariaDescription: summary }),
      marginLeft: 96,
      x: { label: `Energy (${u.energy.label}) →`, grid: true, domain: [Math.min(...xs, 0) - 0.15 * span, Math.max(...xs, 0) + 0.15 * span] },
      y: { label: null, domain: rows.map((r) => r.term) },
      marks,
    },
  };
}
