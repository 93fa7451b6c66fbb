/**
 * The one schema of a trial-sheet row, in SI (m³, s, m³/s, °C). The same schema checks rows of
 * an imported CSV/XLSX, the JSON of `POST …/trials` and the hand-entry form. Errors block a row;
 * plausibility warnings (DOMAIN.md §1.6, §2.1) are shown but do not.
 */
import { z } from 'zod';

/** When the trial was run: a date-time, a clock time of an undated sheet, or seconds since the start. */
export const trialTimeSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('datetime'), iso: z.string().min(10), epochS: z.number().finite() }),
  z.object({ kind: z.literal('clock'), iso: z.string().min(5), epochS: z.number().min(0).max(86400) }),
  z.object({ kind: z.literal('elapsed'), seconds: z.number().finite() }),
]);
export type TrialTime = z.infer<typeof trialTimeSchema>;

const temperature = (what: string) =>
  z.number({ error: (i) => (i.input === undefined ? `${what} is missing` : `${what} is not a number`) })
    .finite({ error: `${what} is not a finite number` })
    .min(-273.15, { error: `${what} is below absolute zero (−273.15 °C)` });

/** A trial-sheet row in SI. Either `flowM3PerS` or `bucketVolumeM3` with one or more `fillTimesS`. */
export const trialRowSchema = z
  .object({
    time: trialTimeSchema.optional(),
    bucketVolumeM3: z.number().finite().positive({ error: 'bucket volume must be more than 0' }).optional(),
    fillTimesS: z.array(z.number().finite().positive({ error: 'a fill time must be more than 0 s' })).max(50).optional(),
    flowM3PerS: z.number({ error: 'flow is not a number' }).finite({ error: 'flow is not a finite number' }).optional(),
    inletTempC: temperature('inlet temperature'),
    outletTempC: temperature('outlet temperature'),
    ambientTempC: temperature('ambient temperature').optional(),
    notes: z.string().max(4000, { error: 'notes are longer than 4000 characters' }).optional(),
  })
  .superRefine((r, ctx) => {
    const fills = r.fillTimesS?.length ?? 0;
    if (r.flowM3PerS === undefined) {
      if (r.bucketVolumeM3 === undefined && fills === 0) {
        ctx.addIssue({ code: 'custom', path: ['flowM3PerS'], message: 'no flow: give a flow reading, or a bucket volume with at least one fill time' });
      } else if (r.bucketVolumeM3 === undefined) {
        ctx.addIssue({ code: 'custom', path: ['bucketVolumeM3'], message: 'fill times without a bucket volume' });
      } else if (fills === 0) {
        ctx.addIssue({ code: 'custom', path: ['fillTimesS'], message: 'a bucket volume without any fill time' });
      }
    }
  });

export type TrialRow = z.infer<typeof trialRowSchema>;

/** A row as validated, with the flow the analysis uses and where it came from. */
export type CheckedTrialRow = TrialRow & {
  /** 1-based line (text file) or row (sheet) of the source */
  line: number;
  /** V / mean(t) for a bucket row, else the flow reading, m³/s */
  flowM3PerS: number;
  flowSource: 'bucket' | 'meter';
};

/** One problem of one row. */
export interface RowIssue {
  line: number;
  severity: 'error' | 'warning';
  /** stable code for the UI (`not_a_number`, `outlet_below_inlet`, …) */
  code: string;
  /** the row schema's field (`inletTempC`) */
  field?: string;
  /** the source column's header */
  column?: string;
  message: string;
}

/** Plausibility limits; change them per lab if needed. */
export interface PlausibilityLimits {
  /** a fill shorter than this is flagged (3 s: the published floor for the bucket method, DOMAIN.md §2.1 [32]) */
  minFillTimeS: number;
  /** water above this is flagged (100 °C: boiling at sea level, DOMAIN.md §1.6) */
  maxWaterTempC: number;
  /** relative difference between a flow reading and the bucket flow that is flagged */
  flowDisagreement: number;
}

export const DEFAULT_PLAUSIBILITY: PlausibilityLimits = { minFillTimeS: 3, maxWaterTempC: 100, flowDisagreement: 0.05 };

/**
 * Warnings that do not block a row: outlet below inlet, water above 100 °C, zero or negative
 * flow, a fill under 3 s, a flow reading that disagrees with the bucket flow.
 */
export function plausibilityWarnings(row: CheckedTrialRow, columns: Partial<Record<string, string>> = {}, limits: PlausibilityLimits = DEFAULT_PLAUSIBILITY): RowIssue[] {
  const out: RowIssue[] = [];
  const w = (code: string, field: string, message: string) => out.push({ line: row.line, severity: 'warning', code, field, column: columns[field], message });
  if (row.outletTempC < row.inletTempC) w('outlet_below_inlet', 'outletTempC', `outlet ${fmt(row.outletTempC)} °C is below inlet ${fmt(row.inletTempC)} °C`);
  if (row.outletTempC > limits.maxWaterTempC) w('above_boiling', 'outletTempC', `outlet ${fmt(row.outletTempC)} °C is above ${limits.maxWaterTempC} °C`);
  if (row.inletTempC > limits.maxWaterTempC) w('above_boiling', 'inletTempC', `inlet ${fmt(row.inletTempC)} °C is above ${limits.maxWaterTempC} °C`);
  if (!(row.flowM3PerS > 0)) w('no_flow', 'flowM3PerS', `flow is ${row.flowM3PerS === 0 ? 'zero' : 'negative'}`);
  (row.fillTimesS ?? []).forEach((t, i) => {
    if (t < limits.minFillTimeS) w('short_fill', 'fillTimesS', `fill ${i + 1} took ${fmt(t)} s, under ${limits.minFillTimeS} s: use a bigger bucket`);
  });
  return out;
}

function fmt(x: number): string {
  return String(Math.round(x * 100) / 100);
}

/** Result of checking one row. */
export type TrialRowResult =
  | { line: number; ok: true; row: CheckedTrialRow; issues: RowIssue[] }
  | { line: number; ok: false; issues: RowIssue[] };

/**
 * Checks one row against the schema, derives the flow (bucket rows: V / mean t, JCGM-style mean
 * of the fill times) and adds plausibility warnings.
 * @param input the row in SI (from `mapTrialRow`, JSON or a form)
 * @param line 1-based source line
 * @param columns field → source header, so messages can name the column
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
  let flowM3PerS: number;
  let flowSource: 'bucket' | 'meter';
  const fills = r.fillTimesS ?? [];
  const bucketFlow = r.bucketVolumeM3 !== undefined && fills.length > 0 ? r.bucketVolumeM3 / (fills.reduce((a, b) => a + b, 0) / fills.length) : undefined;
  if (bucketFlow !== undefined) { flowM3PerS = bucketFlow; flowSource = 'bucket'; }
  else { flowM3PerS = r.flowM3PerS!; flowSource = 'meter'; }
  const row: CheckedTrialRow = { ...r, line, flowM3PerS, flowSource };
  const issues = plausibilityWarnings(row, columns, limits);
  if (bucketFlow !== undefined && r.flowM3PerS !== undefined && r.flowM3PerS > 0 && Math.abs(bucketFlow / r.flowM3PerS - 1) > limits.flowDisagreement) {
    issues.push({ line, severity: 'warning', code: 'flow_disagrees', field: 'flowM3PerS', column: columns.flowM3PerS, message: `the flow reading differs from the bucket flow by ${Math.round(Math.abs(bucketFlow / r.flowM3PerS - 1) * 100)} %; the bucket flow is used` });
  }
  return { line, ok: true, row, issues };
}
