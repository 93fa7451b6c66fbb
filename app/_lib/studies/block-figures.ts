/**
 * Figures of study blocks that only draw (no database): run in the analysis worker pool, so this
 * file stays free of `server-only`, entities and the ORM. The fit block's figure is
 * `fitBlockFigure` in fits/fit-compute.ts.
 */
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { PlotView } from '@/app/_contracts/study-blocks';
import { timeSeriesSegmentsPlot, type LogPoint, type PlotFigure } from '@/app/_plots';
import { plotView } from '../fits/fit-compute';

/** A sensor log's stored overview, as the sensor-log block draws it. */
export interface SensorLogFiguresTask {
  points: { tS: number[]; inletTempC: (number | null)[]; outletTempC: (number | null)[]; flowM3PerS: (number | null)[]; ambientTempC?: (number | null)[]; irradianceWPerM2?: (number | null)[] };
  segments: { startS: number; endS: number }[];
  origin: Date;
  /** samples logged in all (the overview shows fewer) */
  samples: number;
  units: UnitSystem;
}

/** The temperatures (with the air when logged), the flow and, for a collector log, the irradiance of a log's overview with its steady segments, as server SVG. */
export function sensorLogFigures(t: SensorLogFiguresTask): PlotView[] {
  const p = t.points;
  const points: LogPoint[] = p.tS.map((tS, i) => ({
    tS, inletTempC: p.inletTempC[i], outletTempC: p.outletTempC[i], flowM3PerS: p.flowM3PerS[i],
    ...(p.ambientTempC ? { ambientTempC: p.ambientTempC[i] } : {}), ...(p.irradianceWPerM2 ? { irradianceWPerM2: p.irradianceWPerM2[i] } : {}),
  }));
  const figs = timeSeriesSegmentsPlot({ points, segments: t.segments, origin: t.origin }, t.units);
  const samples = `${t.samples.toLocaleString('en-US')} samples logged, ${points.length.toLocaleString('en-US')} shown (reduced for display, keeping every channel's extremes and the endpoints)`;
  const note = (f: PlotFigure): PlotFigure => ({ ...f, summary: t.samples > points.length ? f.summary.replace(/^\d[\d,]* samples/, samples) : f.summary });
  return [plotView(note(figs.temperatures)), plotView(note(figs.flow)), ...(figs.irradiance ? [plotView(note(figs.irradiance))] : [])];
}
