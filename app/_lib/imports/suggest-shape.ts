/**
 * Which of the two shapes of data a file holds: a trial sheet (one row per steady trial) or a
 * sensor log (a time series at a fixed, short interval, to be segmented into steady trials).
 * Judged from the suggested mapping and the first rows: a log maps time, inlet, outlet and flow
 * and no bucket or fill time, and its samples come at most `maxIntervalS` apart (common practice:
 * loggers record every 1–15 s, while hand-written trials are minutes apart).
 */
import type { ConfirmedMappingInput } from './apply-mapping';
import type { MappingSuggestion } from './auto-map';
import type { TrialField } from './column-units';
import { createSensorLogBuilder, type SensorLog } from './sensor-log';

export type DataShape = 'trialSheet' | 'sensorLog';

/** Fields a sensor log maps; anything else is ignored in a log. */
export const LOG_FIELDS: readonly TrialField[] = ['time', 'inletTemp', 'outletTemp', 'flow', 'ambientTemp'];

export interface ShapeSuggestion {
  shape: DataShape;
  /** one sentence for the page */
  reason: string;
  /** median step between the first samples, s (null when the time column cannot be read) */
  medianIntervalS: number | null;
}

/** The suggested columns as a sensor-log mapping (log fields only), or null when a required one is missing. */
export function logMappingFrom(suggestion: MappingSuggestion, decimal: '.' | ','): ConfirmedMappingInput | null {
  const columns = suggestion.columns
    .filter((c) => c.field && LOG_FIELDS.includes(c.field))
    .map((c) => ({ column: c.column, header: c.header, field: c.field!, ...(c.unit ? { unit: c.unit } : {}) }));
  const has = (f: TrialField) => columns.some((c) => c.field === f);
  if (!has('time') || !has('inletTemp') || !has('outletTemp') || !has('flow')) return null;
  return { shape: 'sensorLog', decimal, columns, ...(suggestion.dateOrder === 'dmy' || suggestion.dateOrder === 'mdy' ? { dateOrder: suggestion.dateOrder } : {}) };
}

/** Reads the first rows as a log with `mapping` (rows that fail are only counted). */
export function readLogHead(mapping: unknown, header: readonly string[], rows: (string | number | null)[][], lines: number[]): SensorLog {
  const b = createSensorLogBuilder(mapping, header, {}, { maxIssues: 50 });
  b.add({ rows, lines });
  return b.finish();
}

function median(log: SensorLog): number | null {
  if (log.n < 2) return null;
  const d = Array.from({ length: log.n - 1 }, (_, i) => log.timeS[i + 1] - log.timeS[i]).sort((a, b) => a - b);
  return d[Math.floor(d.length / 2)];
}

/**
 * @param header the file's column names
 * @param rows the first data rows (a few hundred are plenty) and their source lines
 * @param maxIntervalS longest median step of a log, s (default 60)
 * @example suggestShape(s, header, rows, lines).shape // 'sensorLog' for a 1 Hz logger dump
 */
export function suggestShape(
  suggestion: MappingSuggestion, decimal: '.' | ',', header: readonly string[], rows: (string | number | null)[][], lines: number[], maxIntervalS = 60,
): ShapeSuggestion {
  const fields = new Set(suggestion.columns.map((c) => c.field));
  if (fields.has('bucketVolume') || fields.has('fillTime')) return { shape: 'trialSheet', reason: 'It has bucket volume or fill-time columns: one row per trial.', medianIntervalS: null };
  const mapping = logMappingFrom(suggestion, decimal);
  if (!mapping) return { shape: 'trialSheet', reason: 'It lacks a time, inlet, outlet or flow column that a sensor log needs.', medianIntervalS: null };
  let head: SensorLog;
  try {
    head = readLogHead(mapping, header, rows, lines);
  } catch {
    return { shape: 'trialSheet', reason: 'Its columns do not read as a time series.', medianIntervalS: null };
  }
  const step = median(head);
  if (step === null || head.n < 20) return { shape: 'trialSheet', reason: 'Too few timed rows to be a sensor log.', medianIntervalS: step };
  if (step > maxIntervalS) return { shape: 'trialSheet', reason: `Its rows are ${Math.round(step)} s apart: one row per trial.`, medianIntervalS: step };
  return { shape: 'sensorLog', reason: `Its rows are ${step < 10 ? Math.round(step * 10) / 10 : Math.round(step)} s apart: a sensor log, to be split into steady periods.`, medianIntervalS: step };
}
