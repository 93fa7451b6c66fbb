/**
 * Comparing two heater designs from their trials (x = flow m³/s, y = outlet °C, covariates Tin and
 * optional rho, cp). Each dataset is fitted on its own (`fitModel`); the fits are independent, so
 * for the coil model the ratio UA_B/UA_A and the difference Ts_B − Ts_A get their uncertainties by
 * the delta method — first-order propagation (JCGM 100:2008, `gumBudget`), e.g.
 * Var(b/a) ≈ (b/a)²·(Var a/a² + Var b/b²) — with Welch–Satterthwaite degrees of freedom from the two
 * fits' residual degrees of freedom and t intervals. A residual bootstrap of both fits
 * (`bootstrapParameters`, paired resample by resample) checks them. The heat each delivers is
 * compared at one inlet temperature and common flows (performance-table.ts: q = ρ(Tin)·V̇·cp·ΔT),
 * as the percentage difference B/A − 1 with its interval: this is how designs fitted with different
 * models are compared. The verdict is written in plain words (compare-verdict.ts).
 */
import { bootstrapParameters, fitModel, percentileSummary, type FitInput, type FitSuccess } from '../fit';
import { fittedCurve } from '../performance/fitted-curve';
import { heatPerKelvinWPerK, performanceTable } from '../performance/performance-table';
import { gumBudget } from '../trial/gum-budget';
import { requireFinite, requireInRange, requirePositive } from '../units/guards';
import { heatVerdict, parameterStatements } from './compare-verdict';

/** Most trials per design (bounded work: the bootstrap refits each design). */
export const MAX_COMPARE_POINTS = 2000;
/** Most common flows compared. */
export const MAX_COMPARE_FLOWS = 50;
/** Most bootstrap resamples per design. */
export const MAX_COMPARE_RESAMPLES = 2000;
const DEFAULT_RESAMPLES = 400;

/** One design's trials. */
export interface DesignData {
  /** volume flow per trial, m³/s */
  x: number[];
  /** outlet temperature per trial, °C */
  y: number[];
  /** Tin (°C) on every trial; optional rho (kg/m³), cp (J/(kg·K)) */
  covariates: Record<string, number[]>;
  /** 1/u² per trial */
  weights?: number[];
  /** model of this design (default the comparison's) */
  model?: string;
}

/** What to compare. */
export interface CompareDesignsInput {
  a: DesignData;
  b: DesignData;
  /** default 'coil' */
  model?: string;
  /** names in the verdict (default 'A', 'B') */
  labels?: [string, string];
  /** inlet temperature of the heat comparison, °C (default the mean Tin of both datasets) */
  inletTempC?: number;
  /** common flows, m³/s (default five over the overlap of the tested ranges) */
  flowsM3PerS?: number[];
  /** flow of the verdict, m³/s (default the middle common flow) */
  verdictFlowM3PerS?: number;
  /** unit of flows in the verdict's words (default 'L/min') */
  flowUnit?: string;
  level?: number;
  /** residual bootstrap check (default 400 resamples, seed 1); false to skip */
  bootstrap?: { resamples?: number; seed?: number } | false;
}

/** An estimate with its delta-method interval. */
export interface DeltaInterval { value: number; stdErr: number; ciLow: number; ciHigh: number; df: number | null }

/** Heat of both designs at one flow. */
export interface HeatAt {
  flowM3PerS: number;
  a: { heatW: number; ciLow: number; ciHigh: number };
  b: { heatW: number; ciLow: number; ciHigh: number };
  /** 100·(q_B/q_A − 1) */
  differencePercent: DeltaInterval;
  /** outside the tested flows of either design */
  extrapolated: boolean;
  verdict: string;
}

/** The comparison. */
export interface DesignComparison {
  ok: true;
  labels: [string, string];
  models: [string, string];
  fits: { a: FitSummary; b: FitSummary };
  /** UA_B/UA_A (coil against coil; null otherwise) */
  uaRatio: DeltaInterval | null;
  /** Ts_B − Ts_A, K (coil against coil; null otherwise) */
  tsDifferenceK: DeltaInterval | null;
  inletTempC: number;
  level: number;
  heatAt: HeatAt[];
  verdictFlowM3PerS: number;
  verdict: string;
  bootstrap: {
    resamples: number; seed: number; failures: [number, number];
    uaRatio: { ciLow: number; ciHigh: number } | null;
    tsDifferenceK: { ciLow: number; ciHigh: number } | null;
    differencePercent: { ciLow: number; ciHigh: number };
  } | null;
  notes: string[];
}

/** The parameters of one fit. */
export interface FitSummary {
  model: string;
  n: number;
  residualSD: number;
  df: number;
  params: Record<string, { value: number; stdErr: number }>;
  flowRangeM3PerS: [number, number];
  /** the fit's warnings (defaults used, high correlation, unphysical values …) */
  warnings: string[];
}

function summary(f: FitSuccess): FitSummary {
  return {
    model: f.model, n: f.n, residualSD: f.residualSD, df: f.df, flowRangeM3PerS: f.xRange, warnings: f.warnings.map((w) => w.message),
    params: Object.fromEntries(f.parameterNames.map((k) => [k, { value: f.params[k].value, stdErr: f.params[k].stdErr }])),
  };
}

function readData(d: DesignData, name: string): DesignData {
  if (d === null || typeof d !== 'object') throw new TypeError(`${name} must be an object with x, y and covariates`);
  if (!Array.isArray(d.x) || !Array.isArray(d.y)) throw new TypeError(`${name}.x and ${name}.y must be arrays of numbers`);
  if (d.x.length > MAX_COMPARE_POINTS) throw new RangeError(`${name}: at most ${MAX_COMPARE_POINTS} trials, got ${d.x.length}`);
  return d;
}

/** Delta-method interval of f(u, v) from two independent estimates (GUM law of propagation). */
function delta(f: (v: number[]) => number, a: { value: number; u: number; df: number }, b: { value: number; u: number; df: number }, level: number): DeltaInterval {
  const g = gumBudget(f, [{ name: 'a', value: a.value, u: a.u, dof: a.df }, { name: 'b', value: b.value, u: b.u, dof: b.df }], { level });
  return { value: g.value, stdErr: g.uc, ciLow: g.value - g.U, ciHigh: g.value + g.U, df: Number.isFinite(g.nuEff) ? g.nuEff : null };
}

const pct = (v: number[]) => 100 * (v[1] / v[0] - 1);

/**
 * Compares two designs (see the module note).
 * @param input the two datasets and options, SI
 * @returns the comparison, or `{ ok: false, reason }` when either fit cannot be done, or the heat of
 *   A is not positive at a common flow (no percentage can be formed)
 * @throws TypeError / RangeError naming the field for malformed input (x or y not arrays, more than
 *   MAX_COMPARE_POINTS trials, more than MAX_COMPARE_FLOWS flows, flows ≤ 0, resamples outside 10–2000)
 * @example compareDesigns({ a: { x, y, covariates: { Tin } }, b: { x: x2, y: y2, covariates: { Tin: tin2 } } }).verdict
 */
export function compareDesigns(input: CompareDesignsInput): DesignComparison | { ok: false; reason: string } {
  const a = readData(input?.a, 'a');
  const b = readData(input.b, 'b');
  const labels = input.labels ?? ['A', 'B'];
  const level = requireInRange(input.level ?? 0.95, 'level', 0.5, 0.9999);
  const fits: FitSuccess[] = [];
  for (const [d, label] of [[a, labels[0]], [b, labels[1]]] as const) {
    const f = fitModel({ x: d.x, y: d.y, covariates: d.covariates, weights: d.weights, model: d.model ?? input.model ?? 'coil', level } as FitInput);
    if (!f.ok) return { ok: false, reason: `${label}: ${f.reason}` };
    fits.push(f);
  }
  const [fa, fb] = fits;
  const notes: string[] = [];
  const tins = [...(a.covariates?.Tin ?? []), ...(b.covariates?.Tin ?? [])];
  const inletTempC = input.inletTempC !== undefined ? requireFinite(input.inletTempC, 'inletTempC') : tins.length ? tins.reduce((s, v) => s + v, 0) / tins.length : null;
  if (inletTempC === null) throw new RangeError('inletTempC is required when neither dataset has a Tin covariate');
  const lo = Math.max(fa.xRange[0], fb.xRange[0]), hi = Math.min(fa.xRange[1], fb.xRange[1]);
  let flows: number[];
  if (input.flowsM3PerS !== undefined) {
    if (!Array.isArray(input.flowsM3PerS) || input.flowsM3PerS.length === 0 || input.flowsM3PerS.length > MAX_COMPARE_FLOWS) throw new RangeError(`flowsM3PerS must list 1 to ${MAX_COMPARE_FLOWS} flows`);
    flows = input.flowsM3PerS.map((f, i) => requirePositive(f, `flowsM3PerS[${i}]`));
  } else if (hi > lo) {
    flows = Array.from({ length: 5 }, (_, i) => lo + ((hi - lo) * i) / 4);
  } else {
    const [l, h] = [Math.min(fa.xRange[0], fb.xRange[0]), Math.max(fa.xRange[1], fb.xRange[1])];
    flows = Array.from({ length: 5 }, (_, i) => l + ((h - l) * i) / 4);
    notes.push('The two designs were tested over flows that do not overlap: every common flow is an extrapolation for one of them.');
  }
  const verdictFlow = input.verdictFlowM3PerS !== undefined ? requirePositive(input.verdictFlowM3PerS, 'verdictFlowM3PerS') : flows[Math.floor((flows.length - 1) / 2)];
  if (!flows.includes(verdictFlow)) flows.push(verdictFlow);
  const flowUnit = input.flowUnit ?? 'L/min';

  const ta = performanceTable(fa, flows, inletTempC, { level });
  const tb = performanceTable(fb, flows, inletTempC, { level });
  const heatAt: HeatAt[] = [];
  for (let i = 0; i < flows.length; i++) {
    const ra = ta.rows[i], rb = tb.rows[i];
    if (!(ra.heatW > 0)) return { ok: false, reason: `${labels[0]} delivers no heat at ${flows[i]} m³/s and ${inletTempC} °C inlet: a percentage difference cannot be formed` };
    const d = delta(pct, { value: ra.heatW, u: ra.heatSeW, df: fa.df }, { value: rb.heatW, u: rb.heatSeW, df: fb.df }, level);
    heatAt.push({
      flowM3PerS: flows[i],
      a: { heatW: ra.heatW, ciLow: ra.heatCiW[0], ciHigh: ra.heatCiW[1] },
      b: { heatW: rb.heatW, ciLow: rb.heatCiW[0], ciHigh: rb.heatCiW[1] },
      differencePercent: d, extrapolated: ra.extrapolated || rb.extrapolated,
      verdict: heatVerdict(labels, d, flows[i], flowUnit, ra.extrapolated || rb.extrapolated),
    });
  }
  for (const n of [...ta.notes, ...tb.notes]) if (/empirical/.test(n) && !notes.includes(n)) notes.push(n);

  const coil = fa.model === 'coil' && fb.model === 'coil';
  const uaRatio = coil ? delta((v) => v[1] / v[0], { value: fa.params.UA.value, u: fa.params.UA.stdErr, df: fa.df }, { value: fb.params.UA.value, u: fb.params.UA.stdErr, df: fb.df }, level) : null;
  const tsDifferenceK = coil ? delta((v) => v[1] - v[0], { value: fa.params.Ts.value, u: fa.params.Ts.stdErr, df: fa.df }, { value: fb.params.Ts.value, u: fb.params.Ts.stdErr, df: fb.df }, level) : null;
  if (!coil) notes.push(`${labels[0]} and ${labels[1]} were fitted with ${fa.model === fb.model ? `the ${fa.model} model` : `different models (${fa.model}, ${fb.model})`}: they are compared on delivered heat at common conditions only.`);
  else notes.push(...parameterStatements(labels, uaRatio!, tsDifferenceK!));

  const bootstrap = input.bootstrap === false ? null : pairedBootstrap(fa, fb, input.bootstrap ?? {}, level, inletTempC, verdictFlow, coil);
  if (bootstrap && coil && (bootstrap.uaRatio!.ciLow > uaRatio!.value || bootstrap.uaRatio!.ciHigh < uaRatio!.value)) notes.push('The bootstrap interval of the UA ratio does not contain the estimate: the delta-method interval is not reliable here.');
  const v = heatAt.find((h) => h.flowM3PerS === verdictFlow)!;
  return {
    ok: true, labels, models: [fa.model, fb.model], fits: { a: summary(fa), b: summary(fb) }, uaRatio, tsDifferenceK, inletTempC, level,
    heatAt, verdictFlowM3PerS: verdictFlow, verdict: v.verdict, bootstrap, notes,
  };
}

/** Residual bootstrap of both fits, paired resample by resample (independent draws). */
function pairedBootstrap(fa: FitSuccess, fb: FitSuccess, o: { resamples?: number; seed?: number }, level: number, tin: number, flow: number, coil: boolean): DesignComparison['bootstrap'] {
  const resamples = o.resamples ?? DEFAULT_RESAMPLES;
  if (!Number.isInteger(resamples) || resamples < 10 || resamples > MAX_COMPARE_RESAMPLES) throw new RangeError(`bootstrap.resamples must be a whole number from 10 to ${MAX_COMPARE_RESAMPLES}, got ${String(resamples)}`);
  const seed = requireFinite(o.seed ?? 1, 'bootstrap.seed');
  const ba = bootstrapParameters(fa, { resamples, seed });
  const bb = bootstrapParameters(fb, { resamples, seed: seed + 1 });
  if (!ba.ok || !bb.ok) return null;
  const n = Math.min(ba.samples.length, bb.samples.length);
  if (n < resamples / 2) return null;
  const ca = fittedCurve(fa), cb = fittedCurve(fb);
  const heat = (c: typeof ca, p: number[]) => {
    const t = c.evaluate(p, [flow], tin)[0];
    return heatPerKelvinWPerK(flow, tin, t) * (t - tin);
  };
  const ratio: number[] = [], diff: number[] = [], dq: number[] = [];
  const ia = fa.parameterNames, ib = fb.parameterNames;
  for (let k = 0; k < n; k++) {
    const pa = ba.samples[k], pb = bb.samples[k];
    if (coil) {
      ratio.push(pb[ib.indexOf('UA')] / pa[ia.indexOf('UA')]);
      diff.push(pb[ib.indexOf('Ts')] - pa[ia.indexOf('Ts')]);
    }
    const q = pct([heat(ca, pa), heat(cb, pb)]);
    if (Number.isFinite(q)) dq.push(q);
  }
  const ci = (v: number[]) => { const s = percentileSummary(v, level); return { ciLow: s.ciLow, ciHigh: s.ciHigh }; };
  return {
    resamples, seed, failures: [ba.failures, bb.failures],
    uaRatio: coil ? ci(ratio) : null, tsDifferenceK: coil ? ci(diff) : null, differencePercent: ci(dq),
  };
}
