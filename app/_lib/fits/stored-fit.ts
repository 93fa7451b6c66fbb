/**
 * What a saved fit keeps in `Fit.result` (a JSON column), in one place: `storedFitResult` writes
 * it (saveFit) and `parseStoredFit` reads it for every reader — the fit page, study blocks,
 * forecasts, exports and the fit API — with one zod schema. The schema checks what the readers
 * use (parameters, statistics, residuals, the flow choice, the performance rows, the trials); the
 * rest is the analysis result as it was written (analysis/fit, analysis/performance). Free of
 * `server-only`: the analysis worker writes it (fits/fit-compute.ts).
 */
import { z } from 'zod';
import type { FitSuccess, ModelComparison } from '@/analysis/fit';
import { chooseFlow, type FlowChoice } from '@/analysis/performance/choose-flow';
import { performanceTable, type PerformanceTable } from '@/analysis/performance/performance-table';

/** A trial as a saved fit keeps it (`result.trials`): SI, temperatures in °C. */
export interface StoredTrial {
  id: string;
  startedAt: string;
  flowM3PerS: number;
  inletTempC: number;
  outletTempC: number;
  bucketVolumeM3: number | null;
  fillTimesS: number[] | null;
  ambientTempC: number | null;
  notes?: string | null;
}

/** The comparison as stored: the ranking without each model's fit (the chosen fit is `fit`). */
export type StoredComparison = Omit<ModelComparison, 'ranking'> & { ranking: Omit<ModelComparison['ranking'][number], 'fit'>[] };

/** `Fit.result` as written by storedFitResult. */
export interface StoredFit {
  fit: FitSuccess;
  comparison: StoredComparison;
  choice: FlowChoice;
  performance: PerformanceTable;
  trials: StoredTrial[];
}

/** A trial row as saveFit reads it from the database. */
export interface StoredTrialSource {
  id: string;
  startedAt: Date;
  flowM3PerS: number;
  inletTempC: number;
  outletTempC: number;
  bucketVolumeM3?: number | null;
  fillTimesS?: number[] | null;
  ambientTempC?: number | null;
  notes?: string | null;
}

/**
 * The stored result of a fit: the fit, the comparison (without the other models' fits), the flow
 * choice and the performance table at the planning inlet (8 flows from the lowest tested to 1.25 ×
 * the highest), and the trials. Plain JSON (non-finite numbers become null, as JSON has them).
 */
export function storedFitResult(fit: FitSuccess, comparison: ModelComparison, planInletC: number, trials: readonly StoredTrialSource[]): StoredFit {
  const [lo, hi] = fit.xRange;
  const steps = Array.from({ length: 8 }, (_, i) => lo + ((hi * 1.25 - lo) * i) / 7);
  return JSON.parse(
    JSON.stringify({
      fit,
      comparison: { best: comparison.best, verdict: comparison.verdict, ranking: comparison.ranking.map((r) => ({ ...r, fit: undefined })) },
      choice: chooseFlow(fit, planInletC),
      performance: performanceTable(fit, steps, planInletC),
      trials: trials.map((t) => ({ id: t.id, startedAt: t.startedAt.toISOString(), flowM3PerS: t.flowM3PerS, inletTempC: t.inletTempC, outletTempC: t.outletTempC, bucketVolumeM3: t.bucketVolumeM3 ?? null, fillTimesS: t.fillTimesS ?? null, ambientTempC: t.ambientTempC ?? null, notes: t.notes })),
    }),
  ) as StoredFit;
}

const num = z.number();
const maybe = z.number().nullable();
const param = z.looseObject({ value: num, stdErr: maybe, ciLow: maybe, ciHigh: maybe });

/** The one schema of `Fit.result`. */
export const storedFitSchema = z.looseObject({
  fit: z
    .looseObject({
      ok: z.literal(true),
      model: z.string(),
      parameterNames: z.array(z.string()).min(1),
      params: z.record(z.string(), param),
      correlation: z.array(z.array(maybe)),
      n: z.number().int().positive(),
      df: num,
      rss: num,
      residualSD: num,
      level: num,
      fitted: z.array(maybe),
      residuals: z.array(maybe),
      xRange: z.tuple([num, num]),
      flags: z.looseObject({ highLeverage: z.array(num), influential: z.array(num), outliers: z.array(num) }),
      warnings: z.array(z.looseObject({ code: z.string(), message: z.string() })),
    })
    .refine((f) => f.parameterNames.every((p) => p in f.params), { message: 'every parameter name needs an estimate in params' }),
  comparison: z.looseObject({ verdict: z.string(), ranking: z.array(z.looseObject({ label: z.string(), ok: z.boolean() })) }),
  choice: z.looseObject({
    inletTempC: num,
    optimumNote: z.string(),
    minimumFlows: z.array(z.looseObject({ label: z.string(), limitC: num, flowM3PerS: maybe, conservativeFlowM3PerS: maybe })),
    notes: z.array(z.string()),
  }),
  performance: z.looseObject({
    inletTempC: num,
    rows: z.array(z.looseObject({ flowM3PerS: num, outletTempC: num, deltaTK: num, heatW: num })),
    notes: z.array(z.string()),
  }),
  trials: z.array(
    z.looseObject({
      id: z.string(),
      startedAt: z.iso.datetime(),
      flowM3PerS: num,
      inletTempC: num,
      outletTempC: num,
      bucketVolumeM3: maybe,
      fillTimesS: z.array(num).nullable(),
      ambientTempC: maybe,
      notes: z.string().nullish(),
    }),
  ),
});

/** A stored fit result that does not have the shape saveFit writes. */
export class StoredFitError extends Error {
  constructor(readonly fitId: string | null, readonly issues: z.core.$ZodIssue[]) {
    const first = issues.slice(0, 3).map((i) => `${i.path.join('.') || '(the result)'}: ${i.message}`).join('; ');
    super(`The stored result of ${fitId ? `fit ${fitId}` : 'a fit'} is malformed (${first}${issues.length > 3 ? `; ${issues.length - 3} more` : ''}).`);
    this.name = 'StoredFitError';
  }
}

/**
 * Reads `Fit.result` with the one schema.
 * @throws StoredFitError naming the fit and the first paths that do not fit the schema
 * @example parseStoredFit(fit.result, fit.id).fit.params.UA.value // W/K
 */
export function parseStoredFit(result: unknown, fitId: string | null = null): StoredFit {
  const parsed = storedFitSchema.safeParse(result);
  if (!parsed.success) throw new StoredFitError(fitId, parsed.error.issues);
  return parsed.data as unknown as StoredFit;
}
