/**
 * Delivered heat q = ρ·cp·V̇·(Tout − Tin) against flow (DOMAIN.md §1.2–1.3): the fitted curve with its
 * bands, the trials, the coil's ceiling UA·(Ts − Tin), the recommended flow, flows too low to keep
 * the outlet below boiling, and an optimum only when it lies inside the tested flows.
 */
import * as Plot from '@observablehq/plot';
import { baseOptions, COLORS, type PlotFigure } from './theme';
import { displayUnits, fmt, withUnit } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { sentences } from './words';

/** Heat on the curve at one flow, SI (W), with the intervals of the outlet mapped through q. */
export interface HeatCurvePoint {
  flowM3PerS: number;
  heatW: number;
  ciLowW: number;
  ciHighW: number;
  piLowW: number;
  piHighW: number;
}

/** Everything heatPlot draws, SI. */
export interface HeatPlotInput {
  model: string;
  inletTempC: number;
  level: number;
  curve: HeatCurvePoint[];
  trials: { flowM3PerS: number; heatW: number; excluded?: boolean; label?: string }[];
  /** [min, max] tested flow, m³/s */
  testedRange: [number, number];
  /** UA·(Ts − Tin), W, for the coil model (null otherwise) */
  ceilingW: number | null;
  /** the flow to run, m³/s, with the heat there and why */
  recommended: { flowM3PerS: number; heatW: number; reason: string } | null;
  /** an interior maximum of heat (drawn only when inside the tested range) */
  optimum: { flowM3PerS: number; heatW: number } | null;
  /** words about the optimum (e.g. why there is none) */
  optimumNote: string;
  /** flows below which the outlet is predicted to exceed a hard limit (boiling), m³/s */
  unsafeBelow: { flowM3PerS: number; label: string }[];
}

/**
 * Delivered heat against flow, in the user's units (kW or Btu/h; L/min or gpm).
 * @example plotToSvg(heatPlot(heatInputFromFit(fit), 'us').options)
 */
export function heatPlot(input: HeatPlotInput, units: UnitSystem, size: { width?: number; height?: number } = {}): PlotFigure {
  const u = displayUnits(units);
  const F = u.flow.from;
  const P = u.power.from;
  const [lo, hi] = input.testedRange;
  const xs = [...input.curve.map((c) => c.flowM3PerS), ...input.trials.map((t) => t.flowM3PerS), lo, hi];
  const xMin = Math.min(...xs);
  const xMax = Math.max(...xs);
  const band = input.curve.map((c) => ({ x: F(c.flowM3PerS), y: P(c.heatW), ci1: P(c.ciLowW), ci2: P(c.ciHighW), pi1: P(c.piLowW), pi2: P(c.piHighW) }));
  const extrap = [...(xMin < lo ? [{ x1: F(xMin), x2: F(lo) }] : []), ...(xMax > hi ? [{ x1: F(hi), x2: F(xMax) }] : [])];
  const unsafe = input.unsafeBelow.filter((s) => s.flowM3PerS > xMin).map((s) => ({ x1: F(xMin), x2: F(Math.min(s.flowM3PerS, xMax)), label: s.label }));
  const optimumShown = input.optimum && input.optimum.flowM3PerS >= lo && input.optimum.flowM3PerS <= hi ? input.optimum : null;
  const tip = (t: HeatPlotInput['trials'][number]) => `${t.label ? `${t.label}: ` : ''}${withUnit(t.flowM3PerS, u.flow)}, ${withUnit(t.heatW, u.power)}${t.excluded ? ' (excluded from the fit)' : ''}`;
  const dots = (rows: HeatPlotInput['trials']) => rows.map((t) => ({ x: F(t.flowM3PerS), y: P(t.heatW), tip: tip(t) }));
  const pct = `${fmt(input.level * 100, 2)} %`;
  const rec = input.recommended;
  const recExtrapolated = rec !== null && (rec.flowM3PerS < lo || rec.flowM3PerS > hi);

  const marks: Plot.Markish[] = [
    Plot.rect(extrap, { x1: 'x1', x2: 'x2', fill: COLORS.paperDeep, fillOpacity: 0.9, ariaDescription: 'extrapolated region' }),
    Plot.rect(unsafe, { x1: 'x1', x2: 'x2', fill: COLORS.dangerLine, fillOpacity: 0.35, ariaDescription: 'unsafe flows' }),
    Plot.text(unsafe, { x: 'x2', text: 'label', frameAnchor: 'bottom', textAnchor: 'end', dx: -4, dy: -6, fill: COLORS.danger, ariaDescription: 'unsafe flows label' }),
    Plot.areaY(band, { x: 'x', y1: 'pi1', y2: 'pi2', fill: COLORS.heatPale, fillOpacity: 0.22, ariaDescription: `${pct} prediction band` }),
    Plot.areaY(band, { x: 'x', y1: 'ci1', y2: 'ci2', fill: COLORS.heatLight, fillOpacity: 0.35, ariaDescription: `${pct} confidence band` }),
    Plot.ruleY([0], { stroke: COLORS.inkMuted }),
    ...(input.ceilingW !== null ? [
      Plot.ruleY([P(input.ceilingW)], { stroke: COLORS.heatDeep, strokeDasharray: '6 3', ariaDescription: 'ceiling line' }),
      Plot.text([P(input.ceilingW)], { y: (d: number) => d, text: () => `ceiling UA·(Ts − Tin) = ${withUnit(input.ceilingW as number, u.power)}`, frameAnchor: 'left', textAnchor: 'start', dx: 4, dy: 12, fill: COLORS.heatDeep, ariaDescription: 'ceiling label' }),
    ] : []),
    Plot.lineY(band, { x: 'x', y: 'y', stroke: COLORS.heat, strokeWidth: 2.5, ariaDescription: `model ${input.model}` }),
    ...(rec ? [
      Plot.ruleX([F(rec.flowM3PerS)], { stroke: COLORS.water, strokeWidth: 1.5, ariaDescription: 'recommended flow line' }),
      Plot.dot([[F(rec.flowM3PerS), P(rec.heatW)]], { r: 5.5, fill: COLORS.water, stroke: 'white', strokeWidth: 1.5, ariaDescription: 'recommended flow' }),
      Plot.text([F(rec.flowM3PerS)], { x: (d: number) => d, frameAnchor: 'bottom', text: () => `run ${withUnit(rec.flowM3PerS, u.flow)}${recExtrapolated ? ' (extrapolated)' : ''}`, textAnchor: 'end', dx: -6, dy: -22, fill: COLORS.water, fontWeight: 600, ariaDescription: 'recommended flow label' }),
    ] : []),
    ...(optimumShown ? [
      Plot.dot([[F(optimumShown.flowM3PerS), P(optimumShown.heatW)]], { r: 6, symbol: 'triangle', fill: 'none', stroke: COLORS.heatDeep, strokeWidth: 1.75, ariaDescription: 'optimum' }),
      Plot.text([[F(optimumShown.flowM3PerS), P(optimumShown.heatW)]], { text: () => `model maximum ${withUnit(optimumShown.flowM3PerS, u.flow)}`, dy: -12, fill: COLORS.heatDeep, ariaDescription: 'optimum label' }),
    ] : []),
    Plot.dot(dots(input.trials.filter((t) => t.excluded)), { x: 'x', y: 'y', r: 4.5, fill: 'none', stroke: COLORS.inkSoft, strokeWidth: 1.5, title: 'tip', ariaDescription: 'excluded trials' }),
    Plot.dot(dots(input.trials.filter((t) => !t.excluded)), { x: 'x', y: 'y', r: 4, fill: COLORS.point, stroke: 'white', strokeWidth: 1.25, title: 'tip', ariaDescription: 'trials' }),
  ];

  const title = `Delivered heat against flow — ${input.model}`;
  const nIn = input.trials.filter((t) => !t.excluded).length;
  const summary = sentences([
    `heat delivered to the water at an inlet of ${withUnit(input.inletTempC, u.temp)}, from the ${input.model} fit with its ${pct} confidence and prediction bands, and ${nIn} trial${nIn === 1 ? '' : 's'}`,
    `tested flows ${withUnit(lo, u.flow)} to ${withUnit(hi, u.flow)}${extrap.length ? '; beyond them the curve is extrapolated (shaded)' : ''}`,
    input.ceilingW !== null ? `heat rises with flow toward the ceiling UA·(Ts − Tin) = ${withUnit(input.ceilingW, u.power)}; there is no optimum` : '',
    optimumShown ? `the model has a heat maximum at ${withUnit(optimumShown.flowM3PerS, u.flow)} (${withUnit(optimumShown.heatW, u.power)}) inside the tested flows` : input.ceilingW === null ? input.optimumNote : '',
    optimumShown && input.model.startsWith('exp') ? 'an exponential curve always has such a maximum, whatever the hardware does: check it against the coil model' : '',
    rec ? `recommended flow ${withUnit(rec.flowM3PerS, u.flow)} (${rec.reason}), delivering about ${withUnit(rec.heatW, u.power)}${recExtrapolated ? '; it lies outside the tested flows, so test there before relying on it' : ''}` : '',
    ...input.unsafeBelow.map((s) => `below ${withUnit(s.flowM3PerS, u.flow)} the outlet may boil${s.flowM3PerS > xMin ? ' (shaded red)' : ', below the flows plotted'}`),
  ]);
  return {
    title,
    summary,
    options: {
      ...baseOptions({ ...size, ariaLabel: title, ariaDescription: summary }),
      x: { label: `Flow (${u.flow.label}) →`, domain: [F(xMin), F(xMax)], grid: true },
      y: { label: `↑ Delivered heat (${u.power.label})`, grid: true, zero: true },
      marks,
    },
  };
}
