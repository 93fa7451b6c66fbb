/**
 * Adapters from fitting results to the inputs of the plot builders (app/_plots): curves and bands
 * from `predictAt`, heat from the fit and the flow choice, residual diagnostics. They need the
 * fitting engine (mathjs), so they stay on the server and in the analysis worker; the builders
 * they feed are isomorphic.
 */
import { heatOptimum, predictAt, runsTest, type BandPoint, type FitSuccess } from '@/analysis/fit';
import type { FlowChoice } from '@/analysis/performance/choose-flow';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '@/analysis/water/water-properties';
import type { FitCurveInput, FitCurveTrial, HeatPlotInput, ResidualInput, ResidualPoint } from '@/app/_plots';
import { fmt } from '@/app/_contracts/units';

/** Options of the adapter {@link fitCurveInputFromFits}. */
export interface FitCurveFromFitsOptions {
  /** trials left out of the fit, SI (drawn hollow) */
  excluded?: { flowM3PerS: number; outletTempC: number; label?: string }[];
  /** labels of the fitted trials, in the fit's point order */
  labels?: string[];
  /** inlet temperature for the curves and the rule, °C (default: the primary fit's mean Tin) */
  inletTempC?: number;
  /** flows to draw over, m³/s (default: the tested range widened by 10 % below and 25 % above) */
  flowRange?: [number, number];
  /** grid points per curve (default 121) */
  points?: number;
}

/**
 * Adapter from fitting results to {@link FitCurveInput}: curves and bands from `predictAt` over a
 * grid wider than the tested range (so the extrapolated part shows), replicates from the fit.
 * @param fits - successful fits to the same trials, primary first, each with a label
 * @throws RangeError when no fit is given
 * @example fitCurveInputFromFits([{ label: 'coil', fit }], { excluded })
 */
export function fitCurveInputFromFits(fits: { label: string; fit: FitSuccess }[], options: FitCurveFromFitsOptions = {}): FitCurveInput {
  if (fits.length === 0) throw new RangeError('fitCurveInputFromFits: give at least one fit');
  const primary = fits[0].fit;
  const [lo, hi] = primary.xRange;
  const span = hi - lo || Math.abs(hi) || 1;
  const range = options.flowRange ?? [Math.max(lo - 0.1 * span, lo / 2), hi + 0.25 * span];
  const m = Math.max(2, Math.round(options.points ?? 121));
  const grid = Array.from({ length: m }, (_, i) => range[0] + ((range[1] - range[0]) * i) / (m - 1));
  const tinMean = primary.spec.covariateMeans.Tin;
  const inletTempC = options.inletTempC ?? (typeof tinMean === 'number' ? tinMean : null);
  const models = fits.map(({ label, fit }) => ({ label, points: curveOf(fit, grid, inletTempC) }));
  const trials: FitCurveTrial[] = primary.spec.x.map((x, i) => ({ flowM3PerS: x, outletTempC: primary.spec.y[i], label: options.labels?.[i] }));
  for (const e of options.excluded ?? []) trials.push({ ...e, excluded: true });
  const replicates = primary.replicates.map((g) => ({ flowM3PerS: g.xMean, meanC: g.yMean, sdK: g.ySD, n: g.n }));
  return { trials, replicates, models, testedRange: [lo, hi], inletTempC, level: primary.level };
}

/** predictAt over the grid; where the model cannot be evaluated (e.g. x ≤ 0 for the coil), those points are left out. */
function curveOf(fit: FitSuccess, grid: number[], inletTempC: number | null): BandPoint[] {
  const needsTin = fit.spec.covariateNames.includes('Tin') && inletTempC !== null;
  const at = (xs: number[]) => predictAt(fit, xs, needsTin ? { Tin: xs.map(() => inletTempC as number) } : {}, fit.level);
  try {
    return at(grid);
  } catch {
    return grid.flatMap((x) => {
      try {
        return at([x]);
      } catch {
        return [];
      }
    });
  }
}

/** Options of {@link heatInputFromFit}. */
export interface HeatFromFitOptions {
  /** inlet temperature, °C (default the fit's mean Tin) */
  inletTempC?: number;
  /** from chooseFlow(fit, inletTempC): recommended flow, optimum and minimum flows */
  choice?: FlowChoice;
  /** density and specific heat for q (default: the fit's mean rho/cp covariates, else IF97 at the inlet) */
  rhoKgPerM3?: number;
  cpJPerKgK?: number;
  /** trials left out of the fit, SI */
  excluded?: { flowM3PerS: number; outletTempC: number; label?: string }[];
  labels?: string[];
  /** flows to draw over, m³/s (default: the tested range widened, and the recommended flow included) */
  flowRange?: [number, number];
  points?: number;
}

/**
 * Adapter from a fit (and optionally chooseFlow's result) to {@link HeatPlotInput}.
 * @throws RangeError when no inlet temperature is known, or the model cannot be evaluated on the range
 * @example heatPlot(heatInputFromFit(fit, { choice: chooseFlow(fit, 20) }), 'si')
 */
export function heatInputFromFit(fit: FitSuccess, options: HeatFromFitOptions = {}): HeatPlotInput {
  const { spec } = fit;
  const tin = options.inletTempC ?? spec.covariateMeans.Tin;
  if (typeof tin !== 'number' || !Number.isFinite(tin)) throw new RangeError('heatInputFromFit: an inlet temperature inletTempC is needed (the fit has no Tin covariate)');
  const rho = options.rhoKgPerM3 ?? spec.covariateMeans.rho ?? waterDensityKgPerM3(tin, undefined, 'inletTempC');
  const cp = options.cpJPerKgK ?? spec.covariateMeans.cp ?? waterCpJPerKgK(tin, undefined, 'inletTempC');
  const heat = (q: number, t: number, tIn = tin) => rho * cp * q * (t - tIn);
  const choice = options.choice;
  const [lo, hi] = fit.xRange;
  const span = hi - lo || hi || 1;

  let recommended: HeatPlotInput['recommended'] = null;
  let reason = '';
  let flow: number | null = null;
  if (choice?.ceiling) {
    flow = choice.ceiling.flowM3PerS;
    reason = `${fmt(choice.ceiling.fraction * 100, 2)} % of the ceiling`;
  } else if (choice?.optimum) {
    flow = choice.optimum.flowM3PerS;
    reason = 'the model’s heat maximum';
  }
  const boiling = choice?.minimumFlows.find((m) => m.label === 'boiling');
  const boilingFlow = boiling ? Math.max(boiling.flowM3PerS ?? 0, boiling.conservativeFlowM3PerS ?? 0) : 0;
  if (flow !== null && boilingFlow > flow) {
    flow = boilingFlow;
    reason = 'the lowest flow that keeps the outlet below boiling (upper prediction bound)';
  }
  const range = options.flowRange ?? [Math.max(lo - 0.1 * span, lo / 2), Math.max(hi + 0.25 * span, (flow ?? 0) * 1.1)];
  const m = Math.max(2, Math.round(options.points ?? 121));
  const grid = Array.from({ length: m }, (_, i) => range[0] + ((range[1] - range[0]) * i) / (m - 1));
  const needsTin = spec.covariateNames.includes('Tin');
  const band = (xs: number[]) => predictAt(fit, xs, needsTin ? { Tin: xs.map(() => tin) } : {}, fit.level);
  const curve = band(grid).map((b) => ({
    flowM3PerS: b.x, heatW: heat(b.x, b.y), ciLowW: heat(b.x, b.ciLow), ciHighW: heat(b.x, b.ciHigh), piLowW: heat(b.x, b.piLow), piHighW: heat(b.x, b.piHigh),
  }));
  const heatAt = (q: number) => heat(q, band([q])[0].y);
  if (flow !== null) recommended = { flowM3PerS: flow, heatW: heatAt(flow), reason };

  const tinOf = spec.covariates.Tin;
  const trials: HeatPlotInput['trials'] = spec.x.map((x, i) => ({ flowM3PerS: x, heatW: heat(x, spec.y[i], tinOf ? tinOf[i] : tin), label: options.labels?.[i] }));
  for (const e of options.excluded ?? []) trials.push({ flowM3PerS: e.flowM3PerS, heatW: heat(e.flowM3PerS, e.outletTempC), excluded: true, label: e.label });

  let optimum: HeatPlotInput['optimum'] = null;
  let optimumNote: string;
  if (choice) {
    optimum = choice.optimum && { flowM3PerS: choice.optimum.flowM3PerS, heatW: heatAt(choice.optimum.flowM3PerS) };
    optimumNote = choice.optimumNote;
  } else {
    const h = heatOptimum(fit, { TinC: tin, rhoKgPerM3: rho, cpJPerKgK: cp });
    optimum = h.interior ? { flowM3PerS: h.flowM3PerS, heatW: h.heatW } : null;
    optimumNote = h.note;
  }
  const ceilingW = fit.model === 'coil' && fit.params.UA && fit.params.Ts ? fit.params.UA.value * (fit.params.Ts.value - tin) : null;
  const unsafeBelow = boilingFlow > 0 ? [{ flowM3PerS: boilingFlow, label: 'outlet may boil below this flow' }] : [];
  return { model: fit.model, inletTempC: tin, level: fit.level, curve, trials, testedRange: [lo, hi], ceilingW, recommended, optimum, optimumNote, unsafeBelow };
}

/**
 * Adapter from a fit to {@link ResidualInput}.
 * @param fit - a successful fit (points in the fit's order)
 * @param options.labels - a label per point (default `trial 1`, `trial 2`, …)
 * @param options.order - run order per point, 1-based (default the fit's point order)
 * @param options.times - run time per point (when every point has one, the order plot uses time)
 * @throws RangeError when an option array has the wrong length
 * @example residualPlots(residualInputFromFit(fit, { labels }), 'si')
 */
export function residualInputFromFit(fit: FitSuccess, options: { labels?: string[]; order?: number[]; times?: (Date | string | null)[] } = {}): ResidualInput {
  const n = fit.n;
  for (const [k, v] of Object.entries(options)) {
    if (v !== undefined && v.length !== n) throw new RangeError(`residualInputFromFit: ${k} has ${v.length} entries, the fit has ${n} points`);
  }
  const lev = new Set(fit.flags.highLeverage);
  const inf = new Set(fit.flags.influential);
  const out = new Set(fit.flags.outliers);
  const points = fit.spec.x.map((x, i): ResidualPoint => ({
    label: options.labels?.[i] ?? `trial ${i + 1}`,
    flowM3PerS: x,
    fittedC: fit.fitted[i],
    residualK: fit.residuals[i],
    standardized: fit.standardizedResiduals[i],
    studentized: fit.studentizedResiduals[i],
    leverage: fit.leverage[i],
    cooksDistance: fit.cooksDistance[i],
    order: options.order?.[i] ?? i + 1,
    time: options.times?.[i] ?? null,
    flags: [...(lev.has(i) ? ['high-leverage' as const] : []), ...(inf.has(i) ? ['influential' as const] : []), ...(out.has(i) ? ['outlier' as const] : [])],
  }));
  const runs = runsTest(fit.spec.x, fit.residuals);
  return { model: fit.model, points, residualSD: fit.residualSD, leverageLimit: (2 * fit.p) / n, cooksLimit: 4 / n, runs: runs && { runs: runs.runs, pValue: runs.pValue } };
}

