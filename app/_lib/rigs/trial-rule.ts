/**
 * The one rule of a trial, in SI (m³, s, m³/s, °C): what a trial must hold, how its flow is
 * derived, and what is only worth a warning. Every path that makes trials goes through it —
 * `POST /api/rigs/:id/trials` and the entry form (through `apiTrialToRow` in trials.ts), trial
 * sheets (CSV and XLSX, `importTrialSheet`) and the steady periods of sensor logs
 * (`checkTrialRow` on the period means) — so the same trial is accepted or refused alike on each
 * (test/app/trial-paths.test.ts runs the same cases through all of them).
 *
 * The rule, as the README states it:
 * - a trial has an inlet and an outlet temperature, and a flow: a flow reading, or a bucket volume
 *   with one to 50 fill times; with both, the bucket wins (it is the measurement; the reading is
 *   flagged when it differs by more than 5 %), and the bucket flow is V / mean(t)
 *   (`analysis/trial/bucket-flow.ts`, JCGM 100:2008 §4.2);
 * - temperatures between −40 and 150 °C (a reading outside is a sensor or unit mistake); flows,
 *   bucket volumes and fill times above zero (zero flow through a heated coil is a dead-headed
 *   coil); notes of at most 4,000 characters;
 * - a solar-collector trial may also carry the irradiance in the collector plane, 0…1,500 W/m²
 *   (the solar constant is about 1,361 W/m² above the air, so more on the ground is a sensor or
 *   unit mistake; common practice), and the wind over the collector, 0…60 m/s;
 * - warnings, which never block: outlet below inlet, water at or above 100 °C, a fill under 3 s,
 *   a flow reading that disagrees with the bucket.
 */
import { z } from 'zod';
import { bucketFlow } from '@/analysis/trial/bucket-flow';

/** Limits of the rule (ours, stated in the README). */
export const TRIAL_LIMITS = { minTempC: -40, maxTempC: 150, maxFillTimes: 50, maxNotes: 4000, maxIrradianceWPerM2: 1500, maxWindMPerS: 60 } as const;

/** When the trial was run: a date-time, a clock time of an undated sheet, or seconds since the start. */
export const trialTimeSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('datetime'), iso: z.string().min(10), epochS: z.number().finite() }),
  z.object({ kind: z.literal('clock'), iso: z.string().min(5), epochS: z.number().min(0).max(86400) }),
  z.object({ kind: z.literal('elapsed'), seconds: z.number().finite() }),
]);
export type TrialTime = z.infer<typeof trialTimeSchema>;

const fmt = (x: number) => String(Math.round(x * 100) / 100);

const temperature = (what: string) =>
  z
    .number({ error: (i) => (i.input === undefined ? `${what} is missing` : `${what} is not a number`) })
    .finite({ error: `${what} is not a finite number` })
    .min(TRIAL_LIMITS.minTempC, { error: (i) => outside(what, i.input as number) })
    .max(TRIAL_LIMITS.maxTempC, { error: (i) => outside(what, i.input as number) });
const outside = (what: string, v: number) => `${what} ${fmt(v)} °C is outside −40…${TRIAL_LIMITS.maxTempC} °C`;

const DEAD_HEADED = 'flow must be more than 0 (zero flow through a heated coil is a dead-headed coil: steam risk)';

/** A trial in SI. Either `flowM3PerS` or `bucketVolumeM3` with one or more `fillTimesS`. */
export const trialRowSchema = z
  .object({
    time: trialTimeSchema.optional(),
    bucketVolumeM3: z.number().finite().positive({ error: 'bucket volume must be more than 0' }).optional(),
    fillTimesS: z
      .array(z.number().finite().positive({ error: 'a fill time must be more than 0 s' }))
      .max(TRIAL_LIMITS.maxFillTimes, { error: `at most ${TRIAL_LIMITS.maxFillTimes} fill times` })
      .optional(),
    flowM3PerS: z.number({ error: 'flow is not a number' }).finite({ error: 'flow is not a finite number' }).positive({ error: DEAD_HEADED }).optional(),
    inletTempC: temperature('inlet temperature'),
    outletTempC: temperature('outlet temperature'),
    ambientTempC: temperature('ambient temperature').optional(),
    irradianceWPerM2: z
      .number({ error: 'irradiance is not a number' })
      .finite({ error: 'irradiance is not a finite number' })
      .min(0, { error: (i) => `irradiance ${fmt(i.input as number)} W/m² is below 0` })
      .max(TRIAL_LIMITS.maxIrradianceWPerM2, { error: (i) => `irradiance ${fmt(i.input as number)} W/m² is above ${TRIAL_LIMITS.maxIrradianceWPerM2} W/m² (more than the sun gives on the ground: check the unit)` })
      .optional(),
    windMPerS: z
      .number({ error: 'wind is not a number' })
      .finite({ error: 'wind is not a finite number' })
      .min(0, { error: (i) => `wind ${fmt(i.input as number)} m/s is below 0` })
      .max(TRIAL_LIMITS.maxWindMPerS, { error: (i) => `wind ${fmt(i.input as number)} m/s is above ${TRIAL_LIMITS.maxWindMPerS} m/s` })
      .optional(),
    isReference: z.boolean().optional(),
    notes: z.string().max(TRIAL_LIMITS.maxNotes, { error: `notes are longer than ${TRIAL_LIMITS.maxNotes} characters` }).optional(),
  })
  .superRefine((r, ctx) => {
    const fills = r.fillTimesS?.length ?? 0;
    if (r.bucketVolumeM3 !== undefined && fills > 0) return;
    if (r.bucketVolumeM3 !== undefined) ctx.addIssue({ code: 'custom', path: ['fillTimesS'], message: 'a bucket volume without any fill time' });
    else if (fills > 0) ctx.addIssue({ code: 'custom', path: ['bucketVolumeM3'], message: 'fill times without a bucket volume' });
    else if (r.flowM3PerS === undefined) {
      ctx.addIssue({ code: 'custom', path: ['flowM3PerS'], message: 'no flow: give a flow reading, or a bucket volume with at least one fill time' });
    }
  });

export type TrialRow = z.infer<typeof trialRowSchema>;

/** A trial as checked, with the flow the analysis uses and where it came from. */
export type CheckedTrialRow = TrialRow & {
  /** 1-based line (text file) or row (sheet) of the source; the index in a batch of the API */
  line: number;
  /** V / mean(t) for a bucket trial, else the flow reading, m³/s */
  flowM3PerS: number;
  flowSource: 'bucket' | 'meter';
};

/** One problem of one trial. */
export interface RowIssue {
  line: number;
  severity: 'error' | 'warning';
  /** stable code for the UI (`not_a_number`, `outlet_below_inlet`, …) */
  code: string;
  /** the rule's field (`inletTempC`) */
  field?: string;
  /** the source column's header */
  column?: string;
  message: string;
}

/** Plausibility limits; change them per lab if needed. */
export interface PlausibilityLimits {
  /** a fill shorter than this is flagged (3 s: the published floor for the bucket method, DOMAIN.md §2.1 [32]) */
  minFillTimeS: number;
  /** water at or above this is flagged (100 °C: boiling at sea level, DOMAIN.md §1.6) */
  maxWaterTempC: number;
  /** relative difference between a flow reading and the bucket flow that is flagged */
  flowDisagreement: number;
}

export const DEFAULT_PLAUSIBILITY: PlausibilityLimits = { minFillTimeS: 3, maxWaterTempC: 100, flowDisagreement: 0.05 };

/** What is stored of a trial for its warnings (a checked row, or a stored trial). */
type Warnable = { line?: number; inletTempC: number; outletTempC: number; flowM3PerS: number; fillTimesS?: number[] | null };

/**
 * Warnings that do not block a trial: outlet below inlet, water at or above 100 °C, a fill under
 * 3 s. Used for new trials on every path and for the warnings shown with stored ones.
 */
export function plausibilityWarnings(row: Warnable, columns: Partial<Record<string, string>> = {}, limits: PlausibilityLimits = DEFAULT_PLAUSIBILITY): RowIssue[] {
  const out: RowIssue[] = [];
  const line = row.line ?? 0;
  const w = (code: string, field: string, message: string) => out.push({ line, severity: 'warning', code, field, column: columns[field], message });
  if (row.outletTempC < row.inletTempC) w('outlet_below_inlet', 'outletTempC', `outlet ${fmt(row.outletTempC)} °C is below inlet ${fmt(row.inletTempC)} °C: check the sensors are not swapped`);
  if (row.outletTempC >= limits.maxWaterTempC) w('above_boiling', 'outletTempC', `outlet ${fmt(row.outletTempC)} °C is at or above ${limits.maxWaterTempC} °C: water that hot flashes to steam when released`);
  if (row.inletTempC >= limits.maxWaterTempC) w('above_boiling', 'inletTempC', `inlet ${fmt(row.inletTempC)} °C is at or above ${limits.maxWaterTempC} °C: water that hot flashes to steam when released`);
  (row.fillTimesS ?? []).forEach((t, i) => {
    if (t < limits.minFillTimeS) w('short_fill', 'fillTimesS', `fill ${i + 1} took ${fmt(t)} s, under ${limits.minFillTimeS} s: use a bigger bucket`);
  });
  return out;
}

/** Result of checking one trial. */
export type TrialRowResult =
  | { line: number; ok: true; row: CheckedTrialRow; issues: RowIssue[] }
  | { line: number; ok: false; issues: RowIssue[] };

/**
 * Checks one trial against the rule, derives its flow (a bucket trial: V / mean t, from
 * `analysis/trial/bucket-flow.ts`) and adds the plausibility warnings.
 * @param input the trial in SI (from `mapTrialRow`, the API adapter or a log period's means)
 * @param line 1-based source line, or the index in a batch
 * @param columns field → source header (or API field), so messages can name it
 */
export function checkTrialRow(input: unknown, line: number, columns: Partial<Record<string, string>> = {}, limits: PlausibilityLimits = DEFAULT_PLAUSIBILITY): TrialRowResult {
  const parsed = trialRowSchema.safeParse(input);
  if (!parsed.success) {
    const issues: RowIssue[] = parsed.error.issues.map((i) => {
      const field = typeof i.path[0] === 'string' ? i.path[0] : undefined;
      return { line, severity: 'error', code: i.code === 'custom' ? 'incomplete' : 'invalid', field, column: field ? columns[field] : undefined, message: i.message };
    });
    return { line, ok: false, issues };
  }
  const r = parsed.data;
  const bucket = r.bucketVolumeM3 !== undefined && r.fillTimesS?.length ? bucketFlow(r.bucketVolumeM3, r.fillTimesS).flowM3PerS : undefined;
  const row: CheckedTrialRow = { ...r, line, flowM3PerS: bucket ?? r.flowM3PerS!, flowSource: bucket === undefined ? 'meter' : 'bucket' };
  const issues = plausibilityWarnings(row, columns, limits);
  if (bucket !== undefined && r.flowM3PerS !== undefined && Math.abs(bucket / r.flowM3PerS - 1) > limits.flowDisagreement) {
    issues.push({ line, severity: 'warning', code: 'flow_disagrees', field: 'flowM3PerS', column: columns.flowM3PerS, message: `the flow reading differs from the bucket flow by ${Math.round(Math.abs(bucket / r.flowM3PerS - 1) * 100)} %; the bucket flow is used` });
  }
  return { line, ok: true, row, issues };
}

/** The stored fields of a checked trial (the entity's SI columns). */
export function trialFields(row: CheckedTrialRow, startedAt: Date) {
  return {
    startedAt,
    bucketVolumeM3: row.flowSource === 'bucket' ? row.bucketVolumeM3! : null,
    fillTimesS: row.flowSource === 'bucket' ? row.fillTimesS! : null,
    flowM3PerS: row.flowM3PerS,
    inletTempC: row.inletTempC,
    outletTempC: row.outletTempC,
    ambientTempC: row.ambientTempC ?? null,
    irradianceWPerM2: row.irradianceWPerM2 ?? null,
    windMPerS: row.windMPerS ?? null,
    isReference: row.isReference ?? false,
    notes: row.notes ?? '',
  };
}
