/**
 * A sensor log (already reduced for display) with its steady segments shaded and numbered: inlet
 * and outlet temperatures in one panel, flow in a second panel on the same time axis. A long log's
 * many segments are drawn at the plot's resolution (neighbours closer than 2 px share a band,
 * numbers only up to 30 segments) and summarised by count and duration.
 */
import * as Plot from '@observablehq/plot';
import { baseOptions, COLORS, type PlotFigure } from './theme';
import { HAZARD_BANDS, hottestCautions } from '@/analysis/safety/cautions';
import { displayUnits, fmt, withUnit } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { sentences } from './words';

/** Gaps between steady segments narrower than this, in CSS px, are not drawn (one band). */
const MERGE_PX = 2;
/** Segments are numbered on the plot up to this many. */
const LABEL_MAX = 30;
/** The summary names each segment up to this many, then gives their count and range. */
const LIST_MAX = 12;

/** One logged (or reduced) sample, SI. Missing readings are null. */
export interface LogPoint {
  /** seconds from the start of the log */
  tS: number;
  inletTempC: number | null;
  outletTempC: number | null;
  flowM3PerS: number | null;
  /** the air beside the rig, when logged */
  ambientTempC?: number | null;
  /** a collector log's irradiance in the collector plane, W/m² */
  irradianceWPerM2?: number | null;
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

/** The panels of the log: a collector log adds its irradiance. */
export interface TimeSeriesFigures {
  temperatures: PlotFigure;
  flow: PlotFigure;
  /** only when the points carry irradiance */
  irradiance?: PlotFigure;
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
  const width = size.width ?? 720;
  // Periods outside the plotted stretch are left out, those across its ends cut at them. Kept
  // segments closer together than the plot can show (under MERGE_PX apart) share one shaded band,
  // and numbers are written only while they fit: a long log holds hundreds of segments.
  const pxPerS = (width - 80) / Math.max(spanS, 1e-9);
  const visible = input.segments.map((s, i) => ({ ...s, label: s.label ?? String(i + 1) })).filter((s) => s.endS >= t0 && s.startS <= t1);
  const inView = visible.map((s) => ({ ...s, startS: Math.max(s.startS, t0), endS: Math.min(s.endS, t1) }));
  const keptInView = inView.filter((s) => !s.muted);
  const bands: { startS: number; endS: number; label: string }[] = [];
  for (const s of keptInView) {
    const last = bands[bands.length - 1];
    if (last && (s.startS - last.endS) * pxPerS < MERGE_PX) last.endS = Math.max(last.endS, s.endS);
    else bands.push({ startS: s.startS, endS: s.endS, label: s.label });
  }
  const numbered = bands.length === keptInView.length && bands.length <= LABEL_MAX;
  const box = (s: { startS: number; endS: number; label: string }) => ({ x1: at(s.startS), x2: at(s.endS), mid: at((s.startS + s.endS) / 2), label: s.label });
  const segs = bands.map(box);
  const muted = inView.filter((s) => s.muted).map(box);
  const shade = (): Plot.Markish[] => [
    ...(muted.length
      ? [
          Plot.rect(muted, { x1: 'x1', x2: 'x2', fill: COLORS.inkMuted, fillOpacity: 0.06, stroke: COLORS.inkMuted, strokeOpacity: 0.35, strokeDasharray: '3,3', ariaDescription: 'dropped or rejected periods' }),
          ...(muted.length <= LABEL_MAX ? [Plot.text(muted, { x: 'mid', text: 'label', frameAnchor: 'top', dy: 8, fill: COLORS.inkMuted, ariaDescription: 'dropped period labels' })] : []),
        ]
      : []),
    Plot.rect(segs, { x1: 'x1', x2: 'x2', fill: COLORS.water, fillOpacity: 0.1, ariaDescription: 'steady segments' }),
    ...(numbered ? [Plot.text(segs, { x: 'mid', text: 'label', frameAnchor: 'top', dy: 8, fill: COLORS.water, fontWeight: 600, ariaDescription: 'segment numbers' })] : []),
  ];
  const series = (pick: (p: LogPoint) => number | null, conv: (v: number) => number) =>
    input.points.map((p) => {
      const v = pick(p);
      return { x: at(p.tS), y: v === null || !Number.isFinite(v) ? null : conv(v) };
    });
  const inlet = series((p) => p.inletTempC, u.temp.from);
  const outlet = series((p) => p.outletTempC, u.temp.from);
  const flow = series((p) => p.flowM3PerS, u.flow.from);
  const hasAmbient = input.points.some((p) => p.ambientTempC !== undefined && p.ambientTempC !== null);
  const hasSun = input.points.some((p) => p.irradianceWPerM2 !== undefined && p.irradianceWPerM2 !== null);
  const ambient = hasAmbient ? series((p) => p.ambientTempC ?? null, u.temp.from) : [];
  const sun = hasSun ? series((p) => p.irradianceWPerM2 ?? null, (v) => v) : [];
  const n = input.points.length;
  const kept = visible.filter((s) => !s.muted); // the summary gives each period's own length, also when the plot cuts it
  const k = kept.length;
  const duration = spanS >= 3600 ? `${fmt(spanS / 3600, 3)} h` : `${fmt(spanS / 60, 3)} min`;
  const minutes = kept.map((s) => (s.endS - s.startS) / 60);
  const segWords = (!k
    ? 'no steady segment found'
    : k <= LIST_MAX
      ? `${k} steady segment${k === 1 ? '' : 's'} shaded${numbered ? ' and numbered' : ''}: ${kept.map((s, i) => `${s.label} (${fmt(minutes[i], 3)} min)`).join(', ')}`
      : `${k} steady segments shaded${numbered ? ' and numbered' : ''}, ${fmt(Math.min(...minutes), 3)} to ${fmt(Math.max(...minutes), 3)} min long${bands.length < keptInView.length ? `; segments closer than the plot can separate are drawn as one band (${bands.length} band${bands.length === 1 ? '' : 's'} in all)` : ''}`) +
    (muted.length ? `; ${muted.length} dropped or rejected period${muted.length === 1 ? '' : 's'} outlined in grey` : '');
  const range = (rows: { y: number | null }[]) => {
    const ys = rows.map((r) => r.y).filter((v): v is number => v !== null);
    return ys.length ? [Math.min(...ys), Math.max(...ys)] : null;
  };
  const rOut = range(outlet);
  const rIn = range(inlet);
  const rFlow = range(flow);
  const rAmb = hasAmbient ? range(ambient) : null;
  const rSun = hasSun ? range(sun) : null;

  // a line at each caution threshold the logged temperatures reach, and one caution per hazard beside the plot
  const cautions = hottestCautions([
    { where: 'logged outlet', valuesC: input.points.map((p) => p.outletTempC) },
    { where: 'logged inlet', valuesC: input.points.map((p) => p.inletTempC) },
  ], units);
  const reached = new Set(cautions.map((c) => c.thresholdC));
  const hazardLines = HAZARD_BANDS.filter((b) => reached.has(b.thresholdC))
    .map((b) => ({ y: u.temp.from(b.thresholdC), text: `${b.short} ${withUnit(b.thresholdC, u.temp)}`, stroke: b.level === 'danger' ? COLORS.danger : COLORS.caution }));
  const hazardMarks: Plot.Markish[] = hazardLines.flatMap((l) => [
    Plot.ruleY([l.y], { stroke: l.stroke, strokeDasharray: '6 3', strokeWidth: 1.25, ariaDescription: 'caution line' }),
    Plot.text([l], { y: 'y', text: 'text', fill: l.stroke, frameAnchor: 'right', textAnchor: 'end', dx: -4, dy: -7, ariaDescription: 'caution label' }),
  ]);

  const tTitle = 'Logged inlet and outlet temperatures';
  const tSummary = sentences([
    `${n} samples over ${duration}; teal is the inlet${rIn ? ` (${fmt(rIn[0])}–${fmt(rIn[1])} ${u.temp.label})` : ''}, ember the outlet${rOut ? ` (${fmt(rOut[0])}–${fmt(rOut[1])} ${u.temp.label})` : ''}${rAmb ? `, dashed grey the ambient air (${fmt(rAmb[0])}–${fmt(rAmb[1])} ${u.temp.label})` : ''}`,
    segWords,
    hazardLines.length ? `caution lines: ${hazardLines.map((l) => l.text).join('; ')}` : '',
  ]);
  const fTitle = 'Logged flow';
  const fSummary = sentences([`${n} samples of flow over ${duration}${rFlow ? `, ${fmt(rFlow[0])}–${fmt(rFlow[1])} ${u.flow.label}` : ''}`, segWords]);
  const line = (rows: { x: number | Date; y: number | null }[], stroke: string, what: string) =>
    Plot.lineY(rows, { x: 'x', y: 'y', stroke, strokeWidth: 1.5, ariaDescription: what });
  /** a collector log's sun: the irradiance in the collector plane on the same time axis (W/m² in both unit systems) */
  function irradianceFigure(): PlotFigure {
    const title = 'Logged irradiance in the collector plane';
    const summary = sentences([`${n} samples of irradiance over ${duration}${rSun ? `, ${fmt(rSun[0])}–${fmt(rSun[1])} W/m²` : ''}`, segWords]);
    return {
      title,
      summary,
      options: {
        ...baseOptions({ width, height: 200, ariaLabel: title, ariaDescription: summary }),
        x: { ...xOpts },
        y: { label: '↑ Irradiance (W/m²)', grid: true, zero: true },
        marks: [...shade(), line(sun, COLORS.heatLight, 'irradiance')],
      },
    };
  }

  return {
    temperatures: {
      title: tTitle,
      summary: tSummary,
      cautions,
      options: {
        ...baseOptions({ width, height: 300, ariaLabel: tTitle, ariaDescription: tSummary }),
        x: { ...xOpts },
        y: { label: `↑ Temperature (${u.temp.label})`, grid: true },
        marks: [
          ...shade(), ...hazardMarks,
          ...(hasAmbient ? [Plot.lineY(ambient, { x: 'x', y: 'y', stroke: COLORS.inkMuted, strokeWidth: 1.25, strokeDasharray: '4 3', ariaDescription: 'ambient' })] : []),
          line(inlet, COLORS.water, 'inlet'), line(outlet, COLORS.heat, 'outlet'),
        ],
      },
    },
    ...(hasSun ? { irradiance: irradianceFigure() } : {}),
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

