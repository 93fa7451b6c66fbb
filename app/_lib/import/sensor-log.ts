/**
 * A sensor log (1 Hz or faster) from row batches to column arrays in SI, ready for
 * analysis/segment. Rows are converted by the same mapper as trial sheets and checked one by one
 * with `sensorSampleSchema`; a bad row is left out and reported (the first `maxIssues` with their
 * lines, all of them counted), so one bad line never sinks a million good ones.
 */
import { z } from 'zod';
import { checkMapping, createRowMapper, describeMixedUnits, type CellValue, type ColumnUnitReport } from './apply-mapping';
import type { SourceLocation } from './import-error';
import type { RowIssue } from './trial-row';

const temp = (what: string) => z.number({ error: `${what} is missing or not a number` }).finite().min(-273.15, { error: `${what} is below absolute zero` });

/** One logged sample in SI; `timeS` is seconds from the log's first sample. */
export const sensorSampleSchema = z.object({
  timeS: z.number({ error: 'time is missing or unreadable' }).finite(),
  inletTempC: temp('inlet temperature'),
  outletTempC: temp('outlet temperature'),
  flowM3PerS: z.number({ error: 'flow is missing or not a number' }).finite(),
  ambientTempC: temp('ambient temperature').optional(),
});
export type SensorSample = z.infer<typeof sensorSampleSchema>;

/** Column arrays of the accepted samples, in source order. */
export interface SensorLog {
  n: number;
  /** s from the first accepted sample */
  timeS: Float64Array;
  inletTempC: Float64Array;
  outletTempC: Float64Array;
  flowM3PerS: Float64Array;
  ambientTempC: Float64Array | null;
  /** 1-based source line of each sample */
  lines: Int32Array;
  /** what time zero is: an instant (ISO, epoch s) for dated logs, or the log's own zero */
  timeOrigin: { kind: 'datetime'; iso: string; epochS: number } | { kind: 'clock'; iso: string } | { kind: 'elapsed'; seconds: number };
  /** the first rejected rows, with reasons */
  issues: RowIssue[];
  rejectedCount: number;
  /** counts of plausibility warnings over the accepted samples (these do not reject) */
  plausibility: { outletBelowInlet: number; aboveBoiling: number; nonPositiveFlow: number };
  mixedUnits: ColumnUnitReport[];
  notices: string[];
}

export interface SensorLogBuilder {
  add(batch: { rows: CellValue[][]; lines: number[] }): void;
  finish(): SensorLog;
}

class Grow {
  a: Float64Array;
  n = 0;
  constructor(cap: number) { this.a = new Float64Array(cap); }
  push(x: number) {
    if (this.n === this.a.length) { const b = new Float64Array(this.a.length * 2); b.set(this.a); this.a = b; }
    this.a[this.n++] = x;
  }
  done(): Float64Array { return this.a.slice(0, this.n); }
}

/**
 * @param mapping a confirmed mapping with shape `sensorLog` (time, inlet, outlet, flow; ambient optional)
 * @throws ImportError `bad_mapping` / `missing_column`
 * @example
 *   const b = createSensorLogBuilder(mapping, src.header, { file });
 *   for await (const batch of src.batches()) b.add(batch);
 *   const log = b.finish();
 */
export function createSensorLogBuilder(mapping: unknown, header: readonly string[], where: SourceLocation = {}, options: { maxIssues?: number; maxWaterTempC?: number } = {}): SensorLogBuilder {
  const m = checkMapping(mapping, header, where);
  if (m.shape !== 'sensorLog') throw new TypeError('createSensorLogBuilder needs a mapping of shape sensorLog');
  const mapper = createRowMapper(m, header.length);
  const hasAmbient = m.columns.some((c) => c.field === 'ambientTemp');
  const maxIssues = options.maxIssues ?? 1000;
  const maxT = options.maxWaterTempC ?? 100;
  const cap = 1 << 16;
  const t = new Grow(cap), tin = new Grow(cap), tout = new Grow(cap), q = new Grow(cap), amb = new Grow(hasAmbient ? cap : 1);
  const lines: number[] = [];
  const issues: RowIssue[] = [];
  let rejected = 0;
  let origin: SensorLog['timeOrigin'] | null = null;
  let prev = -Infinity;
  let dayOffset = 0;
  const pl = { outletBelowInlet: 0, aboveBoiling: 0, nonPositiveFlow: 0 };
  const reject = (i: RowIssue) => { rejected++; if (issues.length < maxIssues) issues.push(i); };

  return {
    add(batch) {
      for (let i = 0; i < batch.rows.length; i++) {
        const line = batch.lines[i];
        const { row, issues: cellIssues } = mapper.map(batch.rows[i], line);
        if (cellIssues.length) { reject(cellIssues[0]); continue; }
        let timeS: number | undefined;
        const tm = row.time;
        if (tm) {
          if (origin === null) origin = tm.kind === 'elapsed' ? { kind: 'elapsed', seconds: tm.seconds } : tm.kind === 'datetime' ? { kind: 'datetime', iso: tm.iso, epochS: tm.epochS } : { kind: 'clock', iso: tm.iso };
          if (tm.kind === 'elapsed') timeS = tm.seconds - (origin.kind === 'elapsed' ? origin.seconds : 0);
          else if (tm.kind === 'datetime') timeS = origin.kind === 'datetime' ? tm.epochS - origin.epochS : NaN;
          else {
            // clock times: roll over midnight when the clock jumps back by more than 12 h
            let s = tm.epochS + dayOffset;
            if (s < prev - 43200) { dayOffset += 86400; s += 86400; }
            timeS = s;
          }
        }
        const sample = { timeS, inletTempC: row.inletTempC, outletTempC: row.outletTempC, flowM3PerS: row.flowM3PerS, ambientTempC: row.ambientTempC };
        const r = sensorSampleSchema.safeParse(sample);
        if (!r.success) {
          const is = r.error.issues[0];
          const field = String(is.path[0] ?? '');
          reject({ line, severity: 'error', code: 'invalid', field, column: mapper.columnOf[field === 'timeS' ? 'time' : field], message: is.message });
          continue;
        }
        const s = r.data;
        if (hasAmbient && s.ambientTempC === undefined) {
          reject({ line, severity: 'error', code: 'invalid', field: 'ambientTempC', column: mapper.columnOf.ambientTempC, message: 'ambient temperature is missing' });
          continue;
        }
        if (!(s.timeS > prev)) {
          reject({ line, severity: 'error', code: 'time_not_increasing', field: 'timeS', column: mapper.columnOf.time, message: `time does not increase (${s.timeS} s after ${prev} s); the sample is left out` });
          continue;
        }
        prev = s.timeS;
        t.push(s.timeS); tin.push(s.inletTempC); tout.push(s.outletTempC); q.push(s.flowM3PerS);
        if (hasAmbient) amb.push(s.ambientTempC ?? NaN);
        lines.push(line);
        if (s.outletTempC < s.inletTempC) pl.outletBelowInlet++;
        if (s.outletTempC > maxT || s.inletTempC > maxT) pl.aboveBoiling++;
        if (!(s.flowM3PerS > 0)) pl.nonPositiveFlow++;
      }
    },
    finish() {
      const mixedUnits = mapper.mixedUnits();
      let timeS = t.done();
      if (origin?.kind === 'clock' && timeS.length) { const t0 = timeS[0]; timeS = timeS.map((x) => x - t0); }
      return {
        n: t.n, timeS, inletTempC: tin.done(), outletTempC: tout.done(), flowM3PerS: q.done(),
        ambientTempC: hasAmbient ? amb.done() : null, lines: Int32Array.from(lines),
        timeOrigin: origin ?? { kind: 'elapsed', seconds: 0 }, issues, rejectedCount: rejected, plausibility: pl,
        mixedUnits, notices: mixedUnits.map(describeMixedUnits),
      };
    },
  };
}
