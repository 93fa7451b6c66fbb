import { fitModel } from './fit-model';
import { runsTest, type RunsTestResult } from './runs-test';
import type { FitSuccess, ReplicateTolerance } from './types';

/** Data shared by every model in a comparison. */
export interface CompareInput {
  x: number[];
  y: number[];
  covariates?: Record<string, number[]>;
  weights?: number[];
  /** standard uncertainty of one y measurement (unit of y), to judge the residual SD; ignored when weighted */
  measurementSD?: number;
  replicateTolerance?: ReplicateTolerance;
}

/** One model to compare: a built-in name or expression, or an object with start values and bounds. */
export type CompareModel = string | { label?: string; model: string; start?: Record<string, number>; bounds?: Record<string, [number | null, number | null]> };

/** One model's place in a comparison: its fit (or why it failed), AICc standing, residual checks and verdict. */
export interface ComparedModel {
  label: string;
  model: string;
  ok: boolean;
  /** why the fit failed (ok false) */
  reason: string | null;
  fit: FitSuccess | null;
  aicc: number | null;
  /** AICc minus the best AICc */
  deltaAicc: number | null;
  /** Akaike weight exp(−Δ/2)/Σ, among the models with an AICc */
  akaikeWeight: number | null;
  residualSD: number | null;
  /** residual SD over the measurement uncertainty (≈ 1 when the model explains all but noise) */
  sdRatio: number | null;
  runs: RunsTestResult | null;
  /** the runs test finds too few runs at the 5 % level */
  patterned: boolean;
  verdict: string;
}

/** Result of {@link compareModels}. */
export interface ModelComparison {
  /** successful fits by increasing AICc, then the failures */
  ranking: ComparedModel[];
  best: string | null;
  verdict: string;
}

const fmt = (v: number, d = 3) => (Math.abs(v) >= 1e4 || (Math.abs(v) < 1e-3 && v !== 0) ? v.toExponential(d - 1) : v.toPrecision(d));

/**
 * Fits several models to the same trials and ranks them by AICc (Burnham & Anderson, Model
 * Selection and Multimodel Inference, 2nd ed., Springer 2002, §2.4–2.9: Δ and Akaike weights), with
 * the residual SD set against the measurement uncertainty, a runs test on the residual signs for
 * patterned residuals, and a plain-words verdict per model and overall.
 *
 * @param data - trials and options shared by the models (units as for {@link fitModel})
 * @param models - names, expressions or `{ label, model, start, bounds }`
 * @returns the ranking and verdicts (a model that cannot be fitted is listed last with its reason)
 * @throws RangeError when no model is given
 * @example compareModels({ x, y, covariates: { Tin } }, ['coil', 'exp-inlet', 'exp-approach']).best // 'coil'
 */
export function compareModels(data: CompareInput, models: CompareModel[]): ModelComparison {
  if (!Array.isArray(models) || models.length === 0) throw new RangeError('compareModels: give at least one model');
  const entries: ComparedModel[] = models.map((mdl) => {
    const spec = typeof mdl === 'string' ? { model: mdl } : mdl;
    const label = (typeof mdl === 'string' ? mdl : mdl.label) ?? spec.model;
    const fit = fitModel({ x: data.x, y: data.y, covariates: data.covariates, weights: data.weights, replicateTolerance: data.replicateTolerance, model: spec.model, start: spec.start, bounds: spec.bounds });
    if (!fit.ok) return { label, model: spec.model, ok: false, reason: fit.reason, fit: null, aicc: null, deltaAicc: null, akaikeWeight: null, residualSD: null, sdRatio: null, runs: null, patterned: false, verdict: `${label}: cannot be fitted (${fit.reason})` };
    const runs = runsTest(fit.spec.x, fit.residuals);
    const sdRatio = data.weights ? fit.residualSD : data.measurementSD && data.measurementSD > 0 ? fit.residualSD / data.measurementSD : null;
    return { label, model: spec.model, ok: true, reason: null, fit, aicc: fit.aicc, deltaAicc: null, akaikeWeight: null, residualSD: fit.residualSD, sdRatio, runs, patterned: runs !== null && runs.pValue < 0.05, verdict: '' };
  });
  const scored = entries.filter((e) => e.aicc !== null);
  const bestAicc = scored.length ? Math.min(...scored.map((e) => e.aicc as number)) : null;
  if (bestAicc !== null) {
    for (const e of scored) e.deltaAicc = (e.aicc as number) - bestAicc;
    const total = scored.reduce((s, e) => s + Math.exp(-(e.deltaAicc as number) / 2), 0);
    for (const e of scored) e.akaikeWeight = Math.exp(-(e.deltaAicc as number) / 2) / total;
  }
  const ranking = [
    ...entries.filter((e) => e.ok).sort((a, b) => (a.aicc ?? Infinity) - (b.aicc ?? Infinity)),
    ...entries.filter((e) => !e.ok),
  ];
  for (const e of ranking) {
    if (!e.ok || !e.fit) continue;
    const parts: string[] = [];
    if (e.deltaAicc !== null) parts.push(e.deltaAicc === 0 ? `lowest AICc (Akaike weight ${fmt(e.akaikeWeight as number, 2)})` : `ΔAICc ${fmt(e.deltaAicc)} (weight ${fmt(e.akaikeWeight as number, 2)})`);
    else parts.push('no AICc (exact fit or too few points)');
    parts.push(`residual SD ${fmt(e.fit.residualSD)}`);
    if (e.sdRatio !== null) {
      parts.push(e.sdRatio > 2 ? `${fmt(e.sdRatio, 2)} × the measurement uncertainty: scatter the model does not explain`
        : e.sdRatio < 0.5 ? `${fmt(e.sdRatio, 2)} × the measurement uncertainty: the stated uncertainty may be too large`
          : `${fmt(e.sdRatio, 2)} × the measurement uncertainty: consistent with measurement noise`);
    }
    if (e.runs) parts.push(e.patterned ? `patterned residuals (${e.runs.runs} runs in ${e.runs.positives + e.runs.negatives} points, p = ${fmt(e.runs.pValue, 2)}): the model's shape does not match the data` : `residual signs look random (${e.runs.runs} runs, p = ${fmt(e.runs.pValue, 2)})`);
    e.verdict = `${e.label}: ${parts.join('; ')}`;
  }
  const okOnes = ranking.filter((e) => e.ok);
  const best = okOnes[0]?.label ?? null;
  let verdict: string;
  if (!best) verdict = 'none of the models could be fitted';
  else {
    const top = okOnes[0];
    const clear = okOnes.length === 1 || (okOnes[1].deltaAicc ?? Infinity) > 10;
    verdict = `${best} is the best of ${okOnes.length} model${okOnes.length > 1 ? 's' : ''} by AICc${clear ? ', clearly' : ', but not decisively (ΔAICc to the next below 10)'}`;
    if (top.patterned) verdict += '; even so its residuals are patterned, so none of these shapes describes the data well';
    const patterned = okOnes.slice(1).filter((e) => e.patterned).map((e) => e.label);
    if (patterned.length) verdict += `. ${patterned.join(', ')} ${patterned.length > 1 ? 'show' : 'shows'} patterned residuals: the curve shape is wrong, and optima or extrapolations from ${patterned.length > 1 ? 'them' : 'it'} are not to be trusted`;
    verdict += '.';
  }
  return { ranking, best, verdict };
}
