/**
 * A sensor log (1 Hz or faster) from row batches to column arrays in SI, ready for
 * analysis/segment. Rows are converted by the same mapper as trial sheets and checked one by one
 * with `sensorSampleSchema`; a bad row is left out and reported (the first `maxIssues` with their
 * lines, all of them counted), so one bad line never sinks a million good ones.
 *
 * Text blocks (`DelimitedSource.blocks()`) are read row by row by the fast path of `fast-row.ts`
 * where a row is plain; any row it does not take is split into cells and goes through the mapper
 * and the schema like a parsed row, so the schema stays the one contract for every row.
 */
import { z } from 'zod';
import { checkMapping, createRowMapper, describeMixedUnits, type CellValue, type ColumnUnitReport } from './apply-mapping';
import { createFastRowReader, type FastSample } from './fast-row';
import type { SourceLocation } from './import-error';
import type { DataBlock, TextBlock } from './read-delimited';
import type { Delimiter, Newline } from './detect-dialect';
import type { RowIssue } from '../rigs/trial-rule';

const temp = (what: string) => z.number({ error: `${what} is missing or not a number` }).finite().min(-273.15, { error: `${what} is below absolute zero` });

/** One logged sample in SI; `timeS` is seconds from the log's first sample. */
export const sensorSampleSchema = z.object({
  timeS: z.number({ error: 'time is missing or unreadable' }).finite(),
  inletTempC: temp('inlet temperature'),
  outletTempC: temp('outlet temperature'),
  flowM3PerS: z.number({ error: 'flow is missing or not a number' }).finite(),
  ambientTempC: temp('ambient temperature').optional(),
  irradianceWPerM2: z.number({ error: 'irradiance is not a number' }).finite().optional(),
  windMPerS: z.number({ error: 'wind is not a number' }).finite().optional(),
});
export type SensorSample = z.infer<typeof sensorSampleSchema>;

/** What time zero of a log is: an instant (ISO, epoch s) for dated logs, or the log's own zero. */
export type TimeOrigin = { kind: 'datetime'; iso: string; epochS: number } | { kind: 'clock'; iso: string } | { kind: 'elapsed'; seconds: number };

/** Column arrays of the accepted samples, in source order. */
export interface SensorLog {
  n: number;
  /** s from the first accepted sample */
  timeS: Float64Array;
  inletTempC: Float64Array;
  outletTempC: Float64Array;
  flowM3PerS: Float64Array;
  ambientTempC: Float64Array | null;
  /** irradiance in the collector plane (W/m²) and wind (m/s) when mapped (collector logs) */
  irradianceWPerM2: Float64Array | null;
  windMPerS: Float64Array | null;
  /** 1-based source line of each sample */
  lines: Int32Array;
  /** what time zero is: an instant (ISO, epoch s) for dated logs, or the log's own zero */
  timeOrigin: TimeOrigin;
  /** the first rejected rows, with reasons */
  issues: RowIssue[];
  rejectedCount: number;
  /** rows left out because their line was in `excludedLines` */
  excludedCount: number;
  /** counts of plausibility warnings over the accepted samples (these do not reject) */
  plausibility: { outletBelowInlet: number; aboveBoiling: number; nonPositiveFlow: number };
  mixedUnits: ColumnUnitReport[];
  notices: string[];
}

/**
 * The samples accepted so far, as views on the builder's arrays (valid until the next `add`).
 * `timeS` counts from the time origin; for clock logs that is midnight of the first day (midnight
 * roll-overs added), which `finish` shifts to the first sample.
 */
export interface AcceptedSamples {
  n: number;
  timeS: Float64Array;
  inletTempC: Float64Array;
  outletTempC: Float64Array;
  flowM3PerS: Float64Array;
  /** NaN where a log has no ambient column */
  ambientTempC: Float64Array;
  /** collector logs: irradiance (W/m²) and wind (m/s); empty when not mapped */
  irradianceWPerM2: Float64Array;
  windMPerS: Float64Array;
  lines: Int32Array;
  origin: TimeOrigin | null;
  rejectedCount: number;
  /** the first rejected rows (up to maxIssues) */
  issues: readonly RowIssue[];
}

export interface SensorLogBuilder {
  /** Row batches (`batches()`, `readDelimited`) or the blocks of `blocks()`. */
  add(batch: { rows: CellValue[][]; lines: number[] } | DataBlock): void;
  accepted(): AcceptedSamples;
  finish(): SensorLog;
}

export interface SensorLogBuilderOptions {
  maxIssues?: number;
  maxWaterTempC?: number;
  /** lines to leave out before they are read (counted in `excludedCount`) */
  excludedLines?: ReadonlySet<number>;
  /** samples to make room for at once (the arrays grow beyond it as needed) */
  expectedRows?: number;
  /** the file's size in bytes: the first text block's bytes per row then size the arrays for the whole file */
  sizeHintBytes?: number;
  /** the dialect of text blocks (required to add them) */
  text?: { delimiter: Delimiter; newline: Newline };
  /** false sends every row down the general path (for tests that compare the two) */
  fastPath?: boolean;
}

/** The accepted samples' columns, grown by doubling; `reserve` before a block spares a check per value. */
class Columns {
  n = 0;
  t: Float64Array; tin: Float64Array; tout: Float64Array; q: Float64Array; amb: Float64Array; irr: Float64Array; wind: Float64Array; lines: Int32Array;
  constructor(cap: number, private readonly ambient: boolean, private readonly solar: { irradiance: boolean; wind: boolean } = { irradiance: false, wind: false }) {
    this.t = new Float64Array(cap); this.tin = new Float64Array(cap); this.tout = new Float64Array(cap); this.q = new Float64Array(cap);
    this.amb = new Float64Array(ambient ? cap : 0); this.lines = new Int32Array(cap);
    this.irr = new Float64Array(solar.irradiance ? cap : 0); this.wind = new Float64Array(solar.wind ? cap : 0);
  }
  reserve(k: number) {
    const need = this.n + k;
    if (need <= this.t.length) return;
    let cap = this.t.length * 2;
    while (cap < need) cap *= 2;
    const grow = <T extends Float64Array | Int32Array>(a: T, make: (n: number) => T): T => { const b = make(cap); b.set(a.subarray(0, this.n)); return b; };
    const f = (n: number) => new Float64Array(n);
    this.t = grow(this.t, f); this.tin = grow(this.tin, f); this.tout = grow(this.tout, f); this.q = grow(this.q, f);
    if (this.ambient) this.amb = grow(this.amb, f);
    if (this.solar.irradiance) this.irr = grow(this.irr, f);
    if (this.solar.wind) this.wind = grow(this.wind, f);
    this.lines = grow(this.lines, (n) => new Int32Array(n));
  }
  /** a view of the first n values, or a trimmed copy when the array is much larger */
  take<T extends Float64Array | Int32Array>(a: T): T {
    return (a.length > this.n * 1.5 + 1024 ? a.slice(0, this.n) : a.subarray(0, this.n)) as T;
  }
}

function isBlankCells(row: readonly string[]): boolean {
  for (const c of row) if (c.trim() !== '') return false;
  return true;
}

/**
 * @param mapping a confirmed mapping with shape `sensorLog` (time, inlet, outlet, flow; ambient optional)
 * @throws ImportError `bad_mapping` / `missing_column`
 * @example
 *   const b = createSensorLogBuilder(mapping, src.header, { file }, { text: src.dialect });
 *   for await (const block of src.blocks()) b.add(block);
 *   const log = b.finish();
 */
export function createSensorLogBuilder(mapping: unknown, header: readonly string[], where: SourceLocation = {}, options: SensorLogBuilderOptions = {}): SensorLogBuilder {
  const m = checkMapping(mapping, header, where);
  if (m.shape !== 'sensorLog') throw new TypeError('createSensorLogBuilder needs a mapping of shape sensorLog');
  const mapper = createRowMapper(m, header.length);
  const hasAmbient = m.columns.some((c) => c.field === 'ambientTemp');
  const maxIssues = options.maxIssues ?? 1000;
  const maxT = options.maxWaterTempC ?? 100;
  const excluded = options.excludedLines && options.excludedLines.size ? options.excludedLines : null;
  const cap = Math.max(16, Math.min(options.expectedRows ?? 1 << 16, 1 << 27));
  // irradiance and wind (collector logs) go the general path: the fast reader takes the four channels only
  const solar = { irradiance: m.columns.some((c) => c.field === 'irradiance'), wind: m.columns.some((c) => c.field === 'wind') };
  const col = new Columns(cap, hasAmbient, solar);
  const sizeHint = Math.min(options.sizeHintBytes ?? 0, 4e9);
  const issues: RowIssue[] = [];
  let rejected = 0;
  let excludedCount = 0;
  let origin: TimeOrigin | null = null;
  let prev = -Infinity;
  let dayOffset = 0;
  const pl = { outletBelowInlet: 0, aboveBoiling: 0, nonPositiveFlow: 0 };
  const reject = (i: RowIssue) => { rejected++; if (issues.length < maxIssues) issues.push(i); };
  const fast = options.fastPath === false || !options.text ? null : createFastRowReader(m, header.length, options.text.delimiter);
  const fs: FastSample = { time: 0, inletTempC: 0, outletTempC: 0, flowM3PerS: 0, ambientTempC: 0 };

  /** A sample that passed the schema: the time check, then into the arrays. */
  const accept = (line: number, timeS: number, ti: number, to: number, qi: number, a: number | undefined, g?: number, u?: number) => {
    if (!(timeS > prev)) {
      reject({ line, severity: 'error', code: 'time_not_increasing', field: 'timeS', column: mapper.columnOf.time, message: `time does not increase (${timeS} s after ${prev} s); the sample is left out` });
      return;
    }
    prev = timeS;
    const i = col.n++; // room was reserved for the block or batch
    col.t[i] = timeS; col.tin[i] = ti; col.tout[i] = to; col.q[i] = qi;
    if (hasAmbient) col.amb[i] = a ?? NaN;
    if (solar.irradiance) col.irr[i] = g ?? NaN;
    if (solar.wind) col.wind[i] = u ?? NaN;
    col.lines[i] = line;
    if (to < ti) pl.outletBelowInlet++;
    if (to > maxT || ti > maxT) pl.aboveBoiling++;
    if (!(qi > 0)) pl.nonPositiveFlow++;
  };

  /** The general path: the mapper, then the schema. */
  const addRow = (cells: readonly CellValue[], line: number) => {
    const { row, issues: cellIssues } = mapper.map(cells, line);
    if (cellIssues.length) { reject(cellIssues[0]); return; }
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
    const sample = { timeS, inletTempC: row.inletTempC, outletTempC: row.outletTempC, flowM3PerS: row.flowM3PerS, ambientTempC: row.ambientTempC, irradianceWPerM2: row.irradianceWPerM2, windMPerS: row.windMPerS };
    const r = sensorSampleSchema.safeParse(sample);
    if (!r.success) {
      const is = r.error.issues[0];
      const field = String(is.path[0] ?? '');
      reject({ line, severity: 'error', code: 'invalid', field, column: mapper.columnOf[field === 'timeS' ? 'time' : field], message: is.message });
      return;
    }
    const s = r.data;
    if (hasAmbient && s.ambientTempC === undefined) {
      reject({ line, severity: 'error', code: 'invalid', field: 'ambientTempC', column: mapper.columnOf.ambientTempC, message: 'ambient temperature is missing' });
      return;
    }
    if (solar.irradiance && s.irradianceWPerM2 === undefined) {
      reject({ line, severity: 'error', code: 'invalid', field: 'irradianceWPerM2', column: mapper.columnOf.irradianceWPerM2, message: 'irradiance is missing' });
      return;
    }
    accept(line, s.timeS, s.inletTempC, s.outletTempC, s.flowM3PerS, s.ambientTempC, s.irradianceWPerM2, s.windMPerS);
  };

  /**
   * The fast path for one plain row; false sends the row down the general path. The first
   * sample of a log always goes the general way, which sets the time origin.
   */
  const fastRow = (text: string, a: number, b: number, line: number): boolean => {
    if (origin === null || !fast!.read(text, a, b, fs)) return false;
    let timeS: number;
    if (fast!.timeKind === 'datetime') {
      if (origin.kind !== 'datetime') return false;
      timeS = fs.time - origin.epochS;
    } else {
      timeS = fs.time - (origin.kind === 'elapsed' ? origin.seconds : 0);
    }
    mapper.noteBareRow(line);
    accept(line, timeS, fs.inletTempC, fs.outletTempC, fs.flowM3PerS, hasAmbient ? fs.ambientTempC : undefined);
    return true;
  };

  const addText = (block: TextBlock) => {
    if (!options.text) throw new TypeError('createSensorLogBuilder needs options.text (the dialect) to read text blocks');
    const { delimiter, newline } = options.text;
    const nlLen = newline.length;
    if (sizeHint > 0 && col.n === 0 && block.rowCount > 0) {
      // room for the whole file at once, estimated from the first block's bytes per row
      let chars = 0;
      for (const piece of block.texts) chars += piece.length;
      col.reserve(Math.ceil((sizeHint / Math.max(1, chars / block.rowCount)) * 1.02) + 1024);
    }
    col.reserve(block.rowCount);
    let line = block.firstLine;
    for (const text of block.texts) {
      const len = text.length;
      let pos = 0;
      while (pos < len) {
        let e = text.indexOf(newline, pos);
        if (e < 0) e = len;
        const a = pos, ln = line++;
        pos = e + nlLen;
        if (e === a) continue; // an empty line
        if (excluded !== null && excluded.has(ln)) {
          if (!isBlankCells(text.substring(a, e).split(delimiter))) excludedCount++;
          continue;
        }
        if (fast !== null && fastRow(text, a, e, ln)) continue;
        const cells = text.substring(a, e).split(delimiter);
        if (isBlankCells(cells)) continue;
        addRow(cells, ln);
      }
    }
  };

  return {
    add(batch) {
      if ('texts' in batch) { addText(batch); return; }
      col.reserve(batch.rows.length);
      for (let i = 0; i < batch.rows.length; i++) {
        const line = batch.lines[i];
        if (excluded !== null && excluded.has(line)) { excludedCount++; continue; }
        addRow(batch.rows[i], line);
      }
    },
    accepted() {
      const n = col.n;
      return {
        n, timeS: col.t.subarray(0, n), inletTempC: col.tin.subarray(0, n), outletTempC: col.tout.subarray(0, n), flowM3PerS: col.q.subarray(0, n),
        ambientTempC: col.amb.subarray(0, hasAmbient ? n : 0), lines: col.lines.subarray(0, n), origin, rejectedCount: rejected, issues,
        irradianceWPerM2: col.irr.subarray(0, solar.irradiance ? n : 0), windMPerS: col.wind.subarray(0, solar.wind ? n : 0),
      };
    },
    finish() {
      const mixedUnits = mapper.mixedUnits();
      const n = col.n;
      if (origin?.kind === 'clock' && n) { const t0 = col.t[0]; for (let i = 0; i < n; i++) col.t[i] -= t0; }
      // views where the arrays are about full: a million samples should not sit in memory twice
      return {
        n, timeS: col.take(col.t), inletTempC: col.take(col.tin), outletTempC: col.take(col.tout), flowM3PerS: col.take(col.q),
        ambientTempC: hasAmbient ? col.take(col.amb) : null, lines: col.take(col.lines),
        irradianceWPerM2: solar.irradiance ? col.take(col.irr) : null, windMPerS: solar.wind ? col.take(col.wind) : null,
        timeOrigin: origin ?? { kind: 'elapsed', seconds: 0 }, issues, rejectedCount: rejected, excludedCount, plausibility: pl,
        mixedUnits, notices: mixedUnits.map(describeMixedUnits),
      };
    },
  };
}
