/**
 * The CPU-heavy parts of test sessions as pure functions of structured-cloneable data, run in the
 * analysis worker pool (app/_lib/analysis-worker/tasks.ts): the plan (planSession and the runs'
 * inlet sensitivities) and the closing fit (the plan's model on the session's trials, lack of fit,
 * and the next best run). Nothing here may import `server-only`, entities or the ORM.
 */
import { compareModels } from '@/analysis/fit';
import { nextRun } from '@/analysis/plan/next-run';
import { planSession, predictRuns, type SessionPlanInput } from '@/analysis/plan/plan-session';
import { modelLabel } from '@/app/_contracts/models';
import type { FitData } from '../fits/fit-compute';

/** Replicates of a session are runs at one flow set again: flows within 5 % (a bucket-timed flow is never set exactly; common practice). */
export const SESSION_REPLICATE_TOLERANCE = 0.05;

/**
 * The plan and each run's sensitivity of the outlet to the inlet; malformed input answers
 * `{ ok: false, error }` with the RangeError's or TypeError's message (the caller names the field).
 */
export function computeSessionPlan(input: SessionPlanInput) {
  try {
    const plan = planSession(input);
    if (!plan.ok) return { ok: false as const, reason: plan.reason };
    const slopes = predictRuns(input, plan.runs.map((r) => r.flowM3PerS)).map((p) => p.inletSlope);
    return { ok: true as const, plan: JSON.parse(JSON.stringify(plan)) as typeof plan, slopes };
  } catch (e) {
    if (e instanceof RangeError || e instanceof TypeError) return { ok: false as const, error: e.message };
    throw e;
  }
}

export interface SessionFitInput {
  data: FitData;
  model: string;
  measurementUK: number;
  inletTempC: number;
  flowRangeM3PerS: [number, number];
  maxOutletTempC: number;
}

/** The closing fit: parameters, lack of fit and the next best run (analysis/plan nextRun), plain JSON. */
export function computeSessionFit(i: SessionFitInput) {
  const cmp = compareModels({ ...i.data, measurementSD: i.measurementUK, replicateTolerance: { relative: SESSION_REPLICATE_TOLERANCE } }, [{ label: modelLabel(i.model), model: i.model }]);
  const r = cmp.ranking[0];
  if (!r?.ok || !r.fit) return { ok: false as const, reason: r?.reason ?? 'the fit failed' };
  const fit = r.fit;
  const n = nextRun(fit, { inletTempC: i.inletTempC, flowRangeM3PerS: i.flowRangeM3PerS, maxOutletTempC: i.maxOutletTempC, measurementUK: i.measurementUK });
  const lof = fit.lackOfFit;
  return {
    ok: true as const,
    parameterNames: fit.parameterNames,
    params: Object.fromEntries(fit.parameterNames.map((k) => [k, { value: fit.params[k].value, stdErr: fit.params[k].stdErr, ciLow: fit.params[k].ciLow ?? null, ciHigh: fit.params[k].ciHigh ?? null }])),
    residualSD: fit.residualSD,
    r2: fit.r2,
    df: fit.df,
    lackOfFit: lof ? (lof.ok ? { ok: true as const, pValue: lof.pValue } : { ok: false as const, reason: lof.reason }) : null,
    nextRun: n.ok
      ? { ok: true as const, flowM3PerS: n.flowM3PerS, predictedOutletTempC: n.predictedOutletTempC, piLowC: n.piLowC, piHighC: n.piHighC, targetParameter: n.targetParameter, relativeStdErrNow: n.relativeStdErrNow, relativeStdErrAfter: n.relativeStdErrAfter }
      : { ok: false as const, reason: n.reason },
  };
}
