/**
 * Residual plots a reviewer reads (DOMAIN.md §7): residuals against flow, against fitted value and
 * against trial order or time, and a normal Q–Q plot of the standardized residuals; points flagged
 * for high leverage (h > 2p/n), influence (Cook's D > 4/n) or |studentized| > 3 are ringed and titled.
 */
import * as Plot from '@observablehq/plot';
import { normalQuantile } from '@/analysis/stats/distributions';
import { baseOptions, COLORS, type PlotFigure } from './theme';
import { displayUnits, fmt, withUnit, type DisplayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { sentences } from './words';

/** Why a point is flagged, with the fitting engine's thresholds. */
export type ResidualFlag = 'high-leverage' | 'influential' | 'outlier';

/** One fitted point, SI. */
export interface ResidualPoint {
  label: string;
  flowM3PerS: number;
  fittedC: number;
  /** y − ŷ, K */
  residualK: number;
  /** internally studentized residual (null when h = 1) */
  standardized: number | null;
  /** externally studentized residual (null when h = 1) */
  studentized: number | null;
  leverage: number;
  cooksDistance: number | null;
  /** 1-based position in the run order */
  order: number;
  /** when the trial was run, a Date or its ISO 8601 string as JSON carries it (null or absent: plot by order) */
  time?: Date | string | null;
  flags: ResidualFlag[];
}

/** Everything residualPlots draws. */
export interface ResidualInput {
  model: string;
  points: ResidualPoint[];
  /** residual standard deviation s, K (for the ±2s guide lines) */
  residualSD: number;
  /** 2p/n */
  leverageLimit: number;
  /** 4/n */
  cooksLimit: number;
  /** runs test on the residual signs ordered by flow (null when not computable) */
  runs: { runs: number; pValue: number } | null;
}

/** The four residual plots. */
export interface ResidualFigures {
  vsFlow: PlotFigure;
  vsFitted: PlotFigure;
  vsOrder: PlotFigure;
  qq: PlotFigure;
}

function flagText(p: ResidualPoint, input: ResidualInput): string {
  const why = p.flags.map((f) =>
    f === 'high-leverage' ? `high leverage (h = ${fmt(p.leverage, 2)} > 2p/n = ${fmt(input.leverageLimit, 2)})`
      : f === 'influential' ? `influential (Cook's D = ${fmt(p.cooksDistance ?? 0, 2)} > 4/n = ${fmt(input.cooksLimit, 2)})`
        : `outlier (|studentized residual| = ${fmt(Math.abs(p.studentized ?? 0), 2)} > 3)`);
  return `${p.label}: ${why.join(', ')}`;
}

function flaggedSummary(input: ResidualInput): string {
  const flagged = input.points.filter((p) => p.flags.length);
  return flagged.length ? `${flagged.length} flagged (ringed): ${flagged.map((p) => flagText(p, input)).join('; ')}` : 'no point is flagged for leverage, influence or a studentized residual beyond 3';
}

type Row = { x: number | Date; y: number; tip: string; flagged: boolean; mark: string };

/** Points, flag rings and flag labels over a zero rule (or a reference line for the Q–Q plot). */
function scatter(rows: Row[], guides: Plot.Markish[], connect: boolean): Plot.Markish[] {
  const flagged = rows.filter((r) => r.flagged);
  return [
    ...guides,
    ...(connect ? [Plot.line(rows, { x: 'x', y: 'y', stroke: COLORS.inkMuted, strokeOpacity: 0.5, strokeWidth: 1, ariaDescription: 'run order' })] : []),
    Plot.dot(rows, { x: 'x', y: 'y', r: 4, fill: COLORS.point, stroke: 'white', strokeWidth: 1.25, title: 'tip', ariaDescription: 'residuals' }),
    Plot.dot(flagged, { x: 'x', y: 'y', r: 8.5, fill: 'none', stroke: COLORS.danger, strokeWidth: 1.75, title: 'tip', ariaDescription: 'flagged points' }),
    Plot.text(flagged, { x: 'x', y: 'y', text: 'mark', fill: COLORS.danger, dx: 11, textAnchor: 'start', fontWeight: 600, ariaDescription: 'flag labels' }),
  ];
}

function residualGuides(input: ResidualInput, u: DisplayUnits): Plot.Markish[] {
  const s = u.tempDiff.from(input.residualSD);
  return [
    ...(s > 0 ? [Plot.ruleY([-2 * s, 2 * s], { stroke: COLORS.inkMuted, strokeDasharray: '3 4', ariaDescription: '±2 residual SD' })] : []),
    Plot.ruleY([0], { stroke: COLORS.ink, strokeWidth: 1.25, ariaDescription: 'zero line' }),
  ];
}

/** Short flag codes beside a ringed point: H leverage, D Cook's distance, O outlier. */
const code = (p: ResidualPoint) => p.flags.map((f) => (f === 'high-leverage' ? 'H' : f === 'influential' ? 'D' : 'O')).join('');

/**
 * The four residual plots of one fit, in the user's units (residuals as temperature differences:
 * K, or °F intervals).
 * @param input - see {@link ResidualInput} (SI)
 * @param units - 'si' or 'us'
 * @example const { vsFlow, qq } = residualPlots(residualInputFromFit(fit), 'us')
 */
export function residualPlots(input: ResidualInput, units: UnitSystem, size: { width?: number; height?: number } = {}): ResidualFigures {
  const u = displayUnits(units);
  const dim = { width: size.width ?? 420, height: size.height ?? 280 };
  const yRes = { label: `↑ Residual (${u.tempDiff.label})`, grid: true };
  const tip = (p: ResidualPoint) => `${p.flags.length ? flagText(p, input) : p.label}; flow ${withUnit(p.flowM3PerS, u.flow)}, fitted ${withUnit(p.fittedC, u.temp)}, residual ${withUnit(p.residualK, u.tempDiff, 2)}`;
  const row = (p: ResidualPoint, x: number | Date, y = u.tempDiff.from(p.residualK)): Row => ({ x, y, tip: tip(p), flagged: p.flags.length > 0, mark: code(p) });
  const n = input.points.length;
  const maxAbs = input.points.reduce((m, p) => (Math.abs(p.residualK) > Math.abs(m.residualK) ? p : m), input.points[0]);
  const largest = maxAbs ? `largest residual ${withUnit(maxAbs.residualK, u.tempDiff, 2)} (${maxAbs.label})` : '';
  const flags = flaggedSummary(input);
  const runs = input.runs
    ? input.runs.pValue < 0.05
      ? `residual signs form only ${input.runs.runs} runs along the flow (runs test p = ${fmt(input.runs.pValue, 2)}): a pattern, so the model's shape does not match the data`
      : `residual signs form ${input.runs.runs} runs along the flow (runs test p = ${fmt(input.runs.pValue, 2)}): no pattern detected`
    : '';

  const figure = (title: string, parts: string[], options: Plot.PlotOptions): PlotFigure => {
    const summary = sentences(parts);
    return { title, summary, options: { ...baseOptions({ ...dim, ariaLabel: title, ariaDescription: summary }), ...options } };
  };

  const vsFlow = figure(`Residuals against flow — ${input.model}`, [`${n} residuals of the ${input.model} fit against flow; ${largest}`, runs, flags], {
    x: { label: `Flow (${u.flow.label}) →`, grid: true },
    y: yRes,
    marks: scatter(input.points.map((p) => row(p, u.flow.from(p.flowM3PerS))), residualGuides(input, u), false),
  });

  const vsFitted = figure(`Residuals against fitted value — ${input.model}`, [`${n} residuals against the fitted outlet temperature; a curve or a funnel here means a wrong shape or unequal scatter`, flags], {
    x: { label: `Fitted outlet temperature (${u.temp.label}) →`, grid: true },
    y: yRes,
    marks: scatter(input.points.map((p) => row(p, u.temp.from(p.fittedC))), residualGuides(input, u), false),
  });

  const when = (p: ResidualPoint) => (p.time == null ? null : new Date(p.time));
  const byTime = n > 0 && input.points.every((p) => when(p) !== null && Number.isFinite(when(p)!.getTime()));
  const ordered = [...input.points].sort((a, b) => (byTime ? when(a)!.getTime() - when(b)!.getTime() : a.order - b.order));
  const vsOrder = figure(`Residuals against ${byTime ? 'time' : 'trial order'} — ${input.model}`, [`${n} residuals in the order the trials were run (${byTime ? 'by time' : 'by trial number'}); a trend here means drift of the source (fire, burner, sun)`, flags], {
    x: byTime ? { label: 'Time →', type: 'utc', grid: true } : { label: 'Trial order →', grid: true, tickFormat: 'd' },
    y: yRes,
    marks: scatter(ordered.map((p) => row(p, byTime ? when(p)! : p.order)), residualGuides(input, u), true),
  });

  // Normal Q–Q: standardized residuals against Φ⁻¹((i − 3/8)/(m + 1/4)) (Blom 1958 plotting positions)
  const std = input.points.filter((p) => p.standardized !== null).sort((a, b) => (a.standardized as number) - (b.standardized as number));
  const m = std.length;
  const qqRows = std.map((p, i) => row(p, normalQuantile((i + 1 - 0.375) / (m + 0.25)), p.standardized as number));
  const qqExtent = Math.max(1, ...qqRows.flatMap((r) => [Math.abs(r.x as number), Math.abs(r.y)]));
  const qq = figure(`Normal Q–Q plot of standardized residuals — ${input.model}`, [
    `${m} standardized residuals against normal quantiles (Blom plotting positions); points on the line mean normally distributed scatter, an S-shape or bowed ends mean heavy tails or skew`,
    m < n ? `${n - m} point${n - m === 1 ? '' : 's'} with leverage 1 left out` : '',
    flags,
  ], {
    x: { label: 'Normal quantile →', grid: true },
    y: { label: '↑ Standardized residual', grid: true },
    marks: scatter(qqRows, [Plot.line([[-qqExtent, -qqExtent], [qqExtent, qqExtent]], { stroke: COLORS.inkMuted, strokeDasharray: '4 3', ariaDescription: 'reference line y = x' })], false),
  });

  return { vsFlow, vsFitted, vsOrder, qq };
}
