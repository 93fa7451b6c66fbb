import 'server-only';
import { randomUUID } from 'node:crypto';
import type pg from 'pg';
import { segmentStats, type SegmentationResult, type SegmentStats, type SteadyCriteria } from '@/analysis/segment';
import { checkTrialRow } from '../rigs/trial-rule';
import { ImportError } from './import-error';
import { lowerBound, type SegmentChannels } from './log-reader';

/**
 * The period-to-trial step of the sensor-log import: the periods of a log (the lines the engineer
 * chose, or every steady segment found) become trials through the one trial rule
 * (`rigs/trial-rule.ts`, as a typed or imported trial would), and are written with one INSERT.
 *
 * Owns: which periods become trials (a chosen period the rule refuses stops the import with
 * `ImportError('bad_period')`; a found one is left out with a notice), the `segment` JSON stored
 * with each trial (its criteria, lines, times and statistics), and the bulk insert of
 * `origin = 'log-segment'` trials. May import: analysis/segment, rigs/trial-rule, import-error and
 * log-reader (the channel type, lowerBound); `pg` (types) for the caller's connection.
 */

/** Mean of x[a..b], or undefined when any value is missing (NaN) or there is no channel. */
function meanOf(x: ArrayLike<number> | null | undefined, a: number, b: number): number | undefined {
  if (!x || x.length === 0) return undefined;
  let s = 0;
  for (let i = a; i <= b; i++) { if (x[i] !== x[i]) return undefined; s += x[i]; }
  return s / (b - a + 1);
}

/** Largest |x − mean| over a..b (the spread the collector test's steadiness limits check). */
function maxDeviation(x: ArrayLike<number> | null | undefined, a: number, b: number, mean: number | undefined): number | undefined {
  if (!x || x.length === 0 || mean === undefined) return undefined;
  let d = 0;
  for (let i = a; i <= b; i++) d = Math.max(d, Math.abs(x[i] - mean));
  return d;
}

/**
 * A collector log's period: the means of irradiance and wind (for the trial) and the largest
 * deviations from the period means of irradiance, ambient, inlet and flow (stored in the trial's
 * `segment.collectorSpread`, read by the collector test's steadiness check).
 */
export function collectorPeriod(channels: SegmentChannels, a: number, b: number, mean: SegmentStats['mean']) {
  const c = channels.collector;
  const irradianceWPerM2 = meanOf(c?.irradianceWPerM2, a, b);
  const windMPerS = meanOf(c?.windMPerS, a, b);
  if (irradianceWPerM2 === undefined) return { irradianceWPerM2, windMPerS, spread: undefined };
  const flowDev = maxDeviation(channels.flowM3PerS, a, b, mean.flowM3PerS);
  return {
    irradianceWPerM2,
    windMPerS,
    spread: {
      irradianceWPerM2: maxDeviation(c!.irradianceWPerM2, a, b, irradianceWPerM2),
      ambientTempK: maxDeviation(channels.ambientTempC, a, b, mean.ambientTempC ?? undefined),
      inletTempK: maxDeviation(channels.inletTempC, a, b, mean.inletTempC),
      flowRelative: flowDev === undefined || !(mean.flowM3PerS > 0) ? undefined : flowDev / mean.flowM3PerS,
    },
  };
}

/** A period of the log that becomes a trial: samples a..b (inclusive) and their statistics. */
export interface LogPeriod {
  a: number;
  b: number;
  st: SegmentStats;
  /** stored in the trial's `segment` beside the statistics */
  extra: Record<string, unknown>;
}

/** A period the engineer chose, as source lines (inclusive). */
export interface ChosenLines {
  startLine: number;
  endLine: number;
}

/**
 * The periods that become trials: the engineer's (source lines, inclusive), or every steady
 * segment found. Each period's means go through the one trial rule: a period the engineer chose
 * that the rule refuses stops the import with the reason; a found segment it refuses is left out
 * with a notice (pushed to `notices`).
 * @throws ImportError `bad_period` for a chosen period the rule refuses; `bad_mapping` for one
 *   that holds fewer than two samples
 */
export function trialPeriods(
  lines: Int32Array, channels: SegmentChannels, seg: SegmentationResult, criteria: SteadyCriteria,
  chosen: readonly ChosenLines[] | undefined, file: string, notices: string[],
): LogPeriod[] {
  const periods: LogPeriod[] = [];
  const ruled = (p: LogPeriod, explicit: boolean) => {
    const m = p.st.mean;
    const sun = collectorPeriod(channels, p.a, p.b, m);
    const r = checkTrialRow({ flowM3PerS: m.flowM3PerS, inletTempC: m.inletTempC, outletTempC: m.outletTempC, ambientTempC: m.ambientTempC ?? undefined, irradianceWPerM2: sun.irradianceWPerM2, windMPerS: sun.windMPerS }, lines[p.a]);
    if (r.ok) return periods.push(p);
    const why = `the period from line ${lines[p.a]} to ${lines[p.b]} cannot be a trial: ${r.issues.map((i) => i.message).join('; ')}`;
    if (explicit) throw new ImportError('bad_period', why, { file, line: lines[p.a] });
    notices.push(why);
  };
  if (chosen) {
    for (const s of chosen) {
      const a = lowerBound(lines, s.startLine), b = lowerBound(lines, s.endLine + 1) - 1;
      if (b - a < 1) throw new ImportError('bad_mapping', `the period from line ${s.startLine} to ${s.endLine} holds fewer than two samples`, { file });
      ruled({ a, b, st: segmentStats(channels, a, b, criteria.blockS), extra: { chosen: true } }, true);
    }
  } else {
    for (const s of seg.segments) {
      ruled({ a: s.startIndex, b: s.endIndex, st: s, extra: { maxDeviation: s.maxDeviation } }, false);
    }
  }
  return periods;
}

/**
 * Writes the periods as trials of the rig, on the caller's connection and transaction: one
 * statement for all of them (a column array per field: uuid, timestamptz, float8, int, jsonb).
 * @param t0Epoch epoch seconds of the log's first sample (trials start at their first sample)
 */
export async function insertLogTrials(
  client: pg.ClientBase, ids: { labId: string; rigId: string; fileId: string },
  periods: readonly LogPeriod[], lines: Int32Array, channels: SegmentChannels, criteria: SteadyCriteria, t0Epoch: number,
): Promise<void> {
  if (!periods.length) return;
  const t = channels.timeS;
  const cols: unknown[][] = Array.from({ length: 10 }, () => []);
  for (const { a, b, st, extra } of periods) {
    const sun = collectorPeriod(channels, a, b, st.mean);
    const segment = {
      criteria, startLine: lines[a], endLine: lines[b], startTimeS: t[a], endTimeS: t[b],
      durationS: t[b] - t[a], n: st.n, mean: st.mean, sd: st.sd, blockStdError: st.blockStdError,
      blocks: st.blocks, outletSlopeKPerS: st.outletSlopeKPerS, inletSlopeKPerS: st.inletSlopeKPerS,
      ...(sun.spread ? { collectorSpread: sun.spread } : {}), ...extra,
    };
    const values = [randomUUID(), new Date(Math.round((t0Epoch + t[a]) * 1000)), st.mean.flowM3PerS, st.mean.inletTempC, st.mean.outletTempC, st.mean.ambientTempC, lines[a], JSON.stringify(segment), sun.irradianceWPerM2 ?? null, sun.windMPerS ?? null];
    values.forEach((v, c) => cols[c].push(v));
  }
  await client.query(
    `INSERT INTO trial (id, lab_id, rig_id, started_at, flow_m3_per_s, inlet_c, outlet_c, ambient_c, source_file_id, source_line, segment, irradiance_w_per_m2, wind_m_per_s, created_at, updated_at, origin)
     SELECT id, $11, $12, started_at, flow, inlet, outlet, ambient, $13, line, segment, irradiance, wind, now(), now(), 'log-segment'
     FROM unnest($1::uuid[], $2::timestamptz[], $3::float8[], $4::float8[], $5::float8[], $6::float8[], $7::int[], $8::jsonb[], $9::float8[], $10::float8[])
       AS t (id, started_at, flow, inlet, outlet, ambient, line, segment, irradiance, wind)`,
    [...cols, ids.labId, ids.rigId, ids.fileId],
  );
}
