/**
 * The tasks of the analysis worker pool: every CPU-heavy computation the request paths ask for
 * (fits and model comparisons, saved-fit results, design comparisons, forecasts, segmentation
 * previews, server-side plot rendering), each a pure function of structured-cloneable data. Loaded in the worker
 * threads only (entry.cjs), so nothing here may import `server-only`, entities or the ORM.
 * app/_lib/server/analysis-pool.ts is the one caller (`runAnalysis(name, input)`).
 */
import { DomainError } from '../server/errors';
import { InputError } from '@/analysis/units/reading-input';
import { computeAnalysis, computeSavedFit, fitBlockFigure, savedFitFigures } from '../fits/fit-compute';
import { computeForecast, computeForecastExport, computeSeason } from '../forecasts/forecast-compute';
import { sensorLogFigures } from '../studies/block-figures';
import { computeComparison } from '../comparisons/comparison-compute';
import { previewSegments, previewSeries } from '../imports/preview-segments';
import type { SensorLog } from '../imports/sensor-log';
import type { SegmentPreviewInput } from '../imports/sensor-preview';
import { computeSessionFit, computeSessionPlan } from '../sessions/session-compute';

/** A read sensor log and the engineer's input (the segmentation preview). */
interface PreviewTask {
  log: SensorLog;
  input: SegmentPreviewInput;
}

/** Every task by name. */
export const TASKS = {
  analyze: computeAnalysis,
  saveFit: computeSavedFit,
  savedFitFigures,
  fitBlockFigure,
  forecast: computeForecast,
  forecastExport: computeForecastExport,
  forecastSeason: computeSeason,
  sensorLogFigures,
  designComparison: computeComparison,
  previewSegments: (t: PreviewTask) => previewSegments(t.log, t.input),
  previewSeries: (t: PreviewTask) => previewSeries(t.log, t.input),
  sessionPlan: computeSessionPlan,
  sessionFit: computeSessionFit,
};
export type TaskName = keyof typeof TASKS;
export type TaskInput<N extends TaskName> = Parameters<(typeof TASKS)[N]>[0];
export type TaskOutput<N extends TaskName> = ReturnType<(typeof TASKS)[N]>;

/** An error as it crosses back to the request thread: enough to raise the same error there. */
export type TaskError =
  | { type: 'domain'; kind: DomainError['kind']; code: string; message: string; details: Record<string, unknown> }
  | { type: 'input'; message: string; field?: string }
  | { type: 'other'; name: string; message: string; stack?: string };

export type TaskReply<T = unknown> = { ok: true; value: T } | { ok: false; error: TaskError };

function toTaskError(e: unknown): TaskError {
  if (e instanceof DomainError) return { type: 'domain', kind: e.kind, code: e.code, message: e.message, details: e.details };
  if (e instanceof InputError) return { type: 'input', message: e.message, field: e.field };
  const err = e instanceof Error ? e : new Error(String(e));
  return { type: 'other', name: err.name, message: err.message, stack: err.stack };
}

/** What a worker runs for one task: the result, or the error it threw in a form that crosses threads. */
export function runTask({ name, input }: { name: TaskName; input: unknown }): TaskReply {
  try {
    const task = TASKS[name] as (i: unknown) => unknown;
    if (typeof task !== 'function') throw new TypeError(`no analysis task "${String(name)}"`);
    return { ok: true, value: task(input) };
  } catch (e) {
    return { ok: false, error: toTaskError(e) };
  }
}
