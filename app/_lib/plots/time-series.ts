/**
 * A sensor log (already reduced for display) with its steady segments shaded and numbered: inlet
 * and outlet temperatures in one panel, flow in a second panel on the same time axis.
 */
import * as Plot from '@observablehq/plot';
import { baseOptions, COLORS, type PlotFigure } from './theme';
import { displayUnits, fmt, sentences, type UnitSystem } from './units';

/** One logged (or reduced) sample, SI. Missing readings are null. */
export interface LogPoint {
  /** seconds from the start of the log */
  tS: number;
  inletC: number | null;
  outletC: number | null;
  flowM3PerS: number | null;
}

/** A steady segment found in the log, seconds from the start. */
export interface LogSegment {
  startS: number;
  endS: number;
  /** shown on the plot; default its 1-based number */
  label?: string;
  /** drawn grey and outlined: a period found but dropped, or a run that failed the criteria */
  muted?: boolean;
}

/** Everything timeSeriesSegmentsPlot draws. */
export interface TimeSeriesInput {
  points: LogPoint[];
  segments: LogSegment[];
  /** the wall-clock time of tS = 0; when given, the time axis shows clock time (UTC) */
  origin?: Date | null;
}

/** The two panels of the log. */
export interface TimeSeriesFigures {
  temperatures: PlotFigure;
  flow: PlotFigure;
}

/**
 * The sensor log with steady segments, in the user's units.
 * @example const { temperatures, flow } = timeSeriesSegmentsPlot({ points, segments }, 'si')
 */
export function timeSeriesSegmentsPlot(input: TimeSeriesInput, units: UnitSystem, size: { width?: number } = {}): TimeSeriesFigures {
  const u = displayUnits(units);
  const origin = input.origin ?? null;
  const spanS = input.points.length ? input.points[input.points.length - 1].tS - input.points[0].tS : 0;
  const inMinutes = spanS < 3 * 3600;
  const at = (s: number): number | Date => (origin ? new Date(origin.getTime() + s * 1000) : inMinutes ? s / 60 : s / 3600);
  const xOpts: Plot.ScaleOptions = origin
    ? { label: 'Time (UTC) →', type: 'utc', grid: true }
    : { label: `Time from start (${inMinutes ? 'min' : 'h'}) →`, grid: true };
  const t0 = input.points[0]?.tS ?? 0;
  const t1 = input.points[input.points.length - 1]?.tS ?? 0;
  xOpts.domain = [at(t0), at(t1)];
  // periods outside the plotted stretch are left out, those across its ends cut at them
  const all = input.segments
    .map((s, i) => ({ ...s, label: s.label ?? String(i + 1) }))
    .filter((s) => s.endS >= t0 && s.startS <= t1)
    .map((s) => {
      const a = Math.max(s.startS, t0), b = Math.min(s.endS, t1);
      return { x1: at(a), x2: at(b), mid: at((a + b) / 2), label: s.label, muted: !!s.muted };
    });
  const segs = all.filter((s) => !s.muted);
  const muted = all.filter((s) => s.muted);
  const shade = (): Plot.Markish[] => [
    ...(muted.length
      ? [
          Plot.rect(muted, { x1: 'x1', x2: 'x2', fill: COLORS.inkMuted, fillOpacity: 0.06, stroke: COLORS.inkMuted, strokeOpacity: 0.35, strokeDasharray: '3,3', ariaDescription: 'dropped or rejected periods' }),
          ...(muted.length <= 40 ? [Plot.text(muted, { x: 'mid', text: 'label', frameAnchor: 'top', dy: 8, fill: COLORS.inkMuted, ariaDescription: 'dropped period labels' })] : []),
        ]
      : []),
    Plot.rect(segs, { x1: 'x1', x2: 'x2', fill: COLORS.water, fillOpacity: 0.1, ariaDescription: 'steady segments' }),
    // numbers only while they can be read (at most 40 periods in view)
    ...(segs.length <= 40 ? [Plot.text(segs, { x: 'mid', text: 'label', frameAnchor: 'top', dy: 8, fill: COLORS.water, fontWeight: 600, ariaDescription: 'segment numbers' })] : []),
  ];
  const series = (pick: (p: LogPoint) => number | null, conv: (v: number) => number) =>
    input.points.map((p) => {
      const v = pick(p);
      return { x: at(p.tS), y: v === null || !Number.isFinite(v) ? null : conv(v) };
    });
  const inlet = series((p) => p.inletC, u.temp.from);
  const outlet = series((p) => p.outletC, u.temp.from);
  const flow = series((p) => p.flowM3PerS, u.flow.from);
  const n = input.points.length;
  const kept = input.segments.map((s, i) => ({ ...s, label: s.label ?? String(i + 1) })).filter((s) => !s.muted && s.endS >= t0 && s.startS <= t1);
  const k = kept.length;
  const duration = spanS >= 3600 ? `${fmt(spanS / 3600, 3)} h` : `${fmt(spanS / 60, 3)} min`;
  const listed = kept.slice(0, 12).map((s) => `${s.label} (${fmt((s.endS - s.startS) / 60, 3)} min)`).join(', ') + (k > 12 ? ` and ${k - 12} more` : '');
  const segWords = (k ? `${k} steady segment${k === 1 ? '' : 's'} shaded${k <= 40 ? ' and numbered' : ''}: ${listed}` : 'no steady segment found') +
    (muted.length ? `; ${muted.length} dropped or rejected period${muted.length === 1 ? '' : 's'} outlined in grey` : '');
  const range = (rows: { y: number | null }[]) => {
    const ys = rows.map((r) => r.y).filter((v): v is number => v !== null);
    return ys.length ? [Math.min(...ys), Math.max(...ys)] : null;
  };
  const rOut = range(outlet);
  const rIn = range(inlet);
  const rFlow = range(flow);
  const width = size.width ?? 720;

  const tTitle = 'Logged inlet and outlet temperatures';
  const tSummary = sentences([
    `${n} samples over ${duration}; teal is the inlet${rIn ? ` (${fmt(rIn[0])}–${fmt(rIn[1])} ${u.temp.label})` : ''}, ember the outlet${rOut ? ` (${fmt(rOut[0])}–${fmt(rOut[1])} ${u.temp.label})` : ''}`,
    segWords,
  ]);
  const fTitle = 'Logged flow';
  const fSummary = sentences([`${n} samples of flow over ${duration}${rFlow ? `, ${fmt(rFlow[0])}–${fmt(rFlow[1])} ${u.flow.label}` : ''}`, segWords]);
  const line = (rows: { x: number | Date; y: number | null }[], stroke: string, what: string) =>
    Plot.lineY(rows, { x: 'x', y: 'y', stroke, strokeWidth: 1.5, ariaDescription: what });

  return {
    temperatures: {
      title: tTitle,
      summary: tSummary,
      options: {
        ...baseOptions({ width, height: 300, ariaLabel: tTitle, ariaDescription: tSummary }),
        x: { ...xOpts },
        y: { label: `↑ Temperature (${u.temp.label})`, grid: true },
        marks: [...shade(), line(inlet, COLORS.water, 'inlet'), line(outlet, COLORS.heat, 'outlet')],
      },
    },
    flow: {
      title: fTitle,
      summary: fSummary,
      options: {
        ...baseOptions({ width, height: 200, ariaLabel: fTitle, ariaDescription: fSummary }),
        x: { ...xOpts },
        y: { label: `↑ Flow (${u.flow.label})`, grid: true, zero: true },
        marks: [...shade(), line(flow, COLORS.inkSoft, 'flow')],
      },
    },
  };
}

