import { describe, expect, test } from 'vitest';
import { fitModel, type FitSuccess } from '../../../analysis/fit';
import { DEFAULT_OUTLET_U_K, planSession, priorFromFit, type SessionPlan, type SessionPlanInput } from '../../../analysis/plan/plan-session';
import { nextRun } from '../../../analysis/plan/next-run';
import { symmetricInverse } from '../../../analysis/plan/information-matrix';
import { builtinResponseModel, responseAt } from '../../../analysis/plan/model-response';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../../../analysis/water/water-properties';
import { run } from '../../../analysis/cli/plan';
import { InputError } from '../../../analysis/units/reading-input';
import { normalStream } from '../../support/seeded-normals';

const LPM = 1 / 60000;
const contract: SessionPlanInput = { model: 'coil', prior: { values: { Ts: 90, UA: 400 } }, inletTempC: 15, flowRangeM3PerS: [2 * LPM, 20 * LPM], maxOutletTempC: 95, trials: 8 };
const plan = (patch: Partial<SessionPlanInput> = {}): SessionPlan => {
  const r = planSession({ ...contract, ...patch });
  if (!r.ok) throw new Error(r.reason);
  return r;
};

/** Outlet of the coil at the IF97 properties of the inlet, as the plan's model (DOMAIN.md §1.2). */
const coilOutlet = (Ts: number, UA: number, tin: number, flow: number) => Ts - (Ts - tin) * Math.exp(-UA / (waterDensityKgPerM3(tin) * flow * waterCpJPerKgK(tin)));

describe('test-session plan: the rules of the session', () => {
  const p = plan();
  test('no planned flow has an upper prediction bound above the outlet limit', () => {
    for (const r of p.runs) expect(r.piHighC).toBeLessThanOrEqual(95 + 1e-9);
  });
  test('at least four distinct flows (lack of fit testable), the reference first and last, a replicate besides it', () => {
    expect(new Set(p.runs.map((r) => r.flowM3PerS)).size).toBeGreaterThanOrEqual(4);
    expect(p.runs[0].purpose).toBe('reference');
    expect(p.runs[7].purpose).toBe('reference');
    expect(p.runs[0].flowM3PerS).toBe(p.runs[7].flowM3PerS);
    const interior = p.runs.slice(1, 7);
    expect(interior.some((r) => r.purpose === 'replicate')).toBe(true);
    for (const r of interior) {
      const firstAt = p.runs.findIndex((q) => q.flowM3PerS === r.flowM3PerS);
      expect(r.purpose).toBe(firstAt < r.order - 1 ? 'replicate' : 'design');
    }
    expect(p.runs.map((r) => r.order)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
  });
  test('the predicted outlet is the coil model at the prior (DOMAIN.md §1.2), and the PI is symmetric around it', () => {
    for (const r of p.runs) {
      expect(r.predictedOutletTempC).toBeCloseTo(coilOutlet(90, 400, 15, r.flowM3PerS), 10);
      expect(r.piHighC - r.predictedOutletTempC).toBeCloseTo(r.predictedOutletTempC - r.piLowC, 10);
    }
  });
  test('the run order is a seeded shuffle: the same seed gives the same order, another seed another order of the same runs', () => {
    const again = plan();
    const other = plan({ seed: 99 });
    expect(again.runs).toEqual(p.runs);
    expect(p.seed).toBe(1);
    expect(other.seed).toBe(99);
    expect(other.runs.map((r) => r.flowM3PerS)).not.toEqual(p.runs.map((r) => r.flowM3PerS));
    expect(other.runs.map((r) => r.flowM3PerS).sort()).toEqual(p.runs.map((r) => r.flowM3PerS).sort());
  });
  test('D-efficiency: at most 1, above that of evenly spaced flows, and the plan runs at the optimum support points', () => {
    expect(p.dEfficiency).toBeLessThanOrEqual(1);
    expect(p.dEfficiency).toBeGreaterThan(p.evenlySpaced.dEfficiency);
    expect(p.optimum.maxVariance).toBeCloseTo(2, 5); // equivalence theorem: max d = p at the optimum
    for (const s of p.optimum.points) expect(p.runs.some((r) => Math.abs(r.flowM3PerS - s.flowM3PerS) < 1e-12)).toBe(true);
    expect(p.evenlySpaced.flowsM3PerS).toHaveLength(8);
  });
  test('a guessed prior is given the stated default uncertainty: 10 K on Ts, 25 % on UA', () => {
    expect(p.prior).toEqual({ source: 'guess', stdErr: { Ts: 10, UA: 100 }, df: null });
    expect(p.measurementUK).toBeCloseTo(DEFAULT_OUTLET_U_K, 15);
    expect(p.notes.join(' ')).toMatch(/prior is a guess/);
  });
});

describe('minimum safe flow', () => {
  test('with an exact prior and a negligible u the safe flow is the closed form of DOMAIN.md §1.6: UA 400 W/K, Ts 150 °C, Tin 20 °C, 100 °C → 0.1000 kg/s (check value #4)', () => {
    const p = plan({ prior: { values: { Ts: 150, UA: 400 }, covariance: [[0, 0], [0, 0]] }, inletTempC: 20, maxOutletTempC: 100, measurementUK: 1e-9 });
    const rho = waterDensityKgPerM3(20);
    expect(p.closedFormMinimumFlowM3PerS! * rho).toBeCloseTo(0.1, 3); // check #4 uses cp 4186; IF97 cp(20 °C) is 4184.4
    expect(p.minimumSafeFlowM3PerS / p.closedFormMinimumFlowM3PerS!).toBeCloseTo(1, 6);
  });
  test('with the prior uncertain the safe flow is higher, where the upper prediction bound meets the limit', () => {
    const p = plan({ prior: { values: { Ts: 150, UA: 400 }, covariance: [[25, 0], [0, 400]], df: 10 }, inletTempC: 20, maxOutletTempC: 100 });
    expect(p.minimumSafeFlowM3PerS).toBeGreaterThan(p.closedFormMinimumFlowM3PerS! * 1.05);
    const lowest = p.runs.reduce((a, r) => (r.flowM3PerS < a.flowM3PerS ? r : a));
    expect(lowest.flowM3PerS).toBeGreaterThanOrEqual(p.minimumSafeFlowM3PerS);
    expect(p.feasibleRangeM3PerS[0]).toBe(p.minimumSafeFlowM3PerS);
    expect(p.cautions.map((c) => c.code)).toContain('above-boiling-source');
  });
  test('no safe flow in the pump range → ok: false with the reason', () => {
    expect(planSession({ ...contract, prior: { values: { Ts: 150, UA: 2000 } }, maxOutletTempC: 60 })).toMatchObject({ ok: false, reason: expect.stringMatching(/no flow up to 20.00 L\/min/) });
  });
});

describe('expected standard errors after the session', () => {
  test('match the spread of fits of simulated sessions at the planned flows (300 seeded sessions; within 12 %)', () => {
    const p = plan({ prior: { values: { Ts: 90, UA: 400 }, covariance: [[4, 0], [0, 400]], df: 20 }, measurementUK: 0.3 });
    const z = normalStream(11);
    const ts: number[] = [];
    const ua: number[] = [];
    const tin = 15;
    const rho = waterDensityKgPerM3(tin), cp = waterCpJPerKgK(tin);
    for (let s = 0; s < 300; s++) {
      const x = p.runs.map((r) => r.flowM3PerS);
      const y = x.map((f) => coilOutlet(90, 400, tin, f) + 0.3 * z());
      const fit = fitModel({ x, y, model: 'coil', covariates: { Tin: x.map(() => tin), rho: x.map(() => rho), cp: x.map(() => cp) } });
      if (!fit.ok) throw new Error(fit.reason);
      ts.push(fit.params.Ts.value);
      ua.push(fit.params.UA.value);
    }
    const sd = (v: number[]) => { const m = v.reduce((a, b) => a + b, 0) / v.length; return Math.sqrt(v.reduce((a, b) => a + (b - m) ** 2, 0) / (v.length - 1)); };
    expect(Math.abs(sd(ts) / p.expectedStdErr.Ts - 1)).toBeLessThan(0.12);
    expect(Math.abs(sd(ua) / p.expectedStdErr.UA - 1)).toBeLessThan(0.12);
  });
});

describe('priors from a saved fit, and other models', () => {
  const tin = 15;
  const x = [3, 5, 8, 12, 16, 20].map((q) => q * LPM);
  const z = normalStream(3);
  const fit = fitModel({ x, y: x.map((f) => coilOutlet(90, 400, tin, f) + 0.2 * z()), model: 'coil', covariates: { Tin: x.map(() => tin), rho: x.map(() => waterDensityKgPerM3(tin)), cp: x.map(() => waterCpJPerKgK(tin)) } }) as FitSuccess;
  test('priorFromFit carries the parameters, covariance and df: the plan uses Student t at the fit\'s df', () => {
    expect(fit.ok).toBe(true);
    const prior = priorFromFit(fit);
    expect(prior.df).toBe(4);
    const p = plan({ prior });
    expect(p.prior.source).toBe('covariance');
    expect(p.prior.stdErr.Ts).toBeCloseTo(fit.params.Ts.stdErr, 12);
  });
  test('exp-inlet (A, k) and exp-approach (Tinf, A, k) plans meet the same rules; three parameters still get four distinct flows (one lack-of-fit degree of freedom)', () => {
    const e = plan({ model: 'exp-inlet', prior: { values: { A: 60, k: 0.1 / LPM } }, inletTempC: 20, maxOutletTempC: 95 });
    expect(new Set(e.runs.map((r) => r.flowM3PerS)).size).toBeGreaterThanOrEqual(4);
    const a = plan({ model: 'exp-approach', prior: { values: { Tinf: 20, A: 60, k: 0.1 / LPM }, covariance: [[1, 0, 0], [0, 4, 0], [0, 0, (0.005 / LPM) ** 2]] }, inletTempC: 20, maxOutletTempC: 95, trials: 10 });
    expect(new Set(a.runs.map((r) => r.flowM3PerS)).size).toBeGreaterThanOrEqual(4);
    for (const r of a.runs) expect(r.piHighC).toBeLessThanOrEqual(95 + 1e-9);
  });
  test.each([
    [{ model: 'poly2' }, /model must be one of/],
    [{ prior: { values: { Ts: 90 } } }, /prior.values.UA/],
    [{ prior: { values: { Ts: 90, UA: 400 }, covariance: [[1, 0]] } }, /2×2/],
    [{ prior: { values: { Ts: 90, UA: 400 }, covariance: [[1, 2], [3, 4]] } }, /symmetric/],
    [{ flowRangeM3PerS: [20 * LPM, 2 * LPM] as [number, number] }, /low < high/],
    [{ flowRangeM3PerS: [0, 2 * LPM] as [number, number] }, /flowRangeM3PerS\[0\]/],
    [{ maxOutletTempC: 10 }, /maxOutletTempC/],
    [{ trials: 61 }, /trials/],
    [{ trials: 5 }, /trials/],
    [{ gridPoints: 5000 }, /gridPoints/],
    [{ distinctFlows: 7 }, /distinctFlows/],
  ])('malformed input %j throws naming the field', (patch, msg) => {
    expect(() => planSession({ ...contract, ...(patch as Partial<SessionPlanInput>) })).toThrow(msg);
  });
});

describe('sequential design: the next run', () => {
  const tin = 15;
  const rho = waterDensityKgPerM3(tin), cp = waterCpJPerKgK(tin);
  const z = normalStream(21);
  // only high flows so far: Ts is poorly determined (DOMAIN.md §1.5 b: low-flow points carry the information on Ts)
  const x = [12, 14, 16, 18, 20, 20].map((q) => q * LPM);
  const fit = fitModel({ x, y: x.map((f) => coilOutlet(90, 400, tin, f) + 0.2 * z()), model: 'coil', covariates: { Tin: x.map(() => tin), rho: x.map(() => rho), cp: x.map(() => cp) } }) as FitSuccess;
  const options = { inletTempC: tin, flowRangeM3PerS: [2 * LPM, 20 * LPM] as [number, number], maxOutletTempC: 95, measurementUK: 0.2 };
  const next = nextRun(fit, options);
  test('targets the parameter with the largest relative standard error (Ts against Ts − Tin, UA against UA) and asks for a low flow, inside the safe range', () => {
    if (!next.ok) throw new Error(next.reason);
    const rel = { Ts: fit.params.Ts.stdErr / (fit.params.Ts.value - tin), UA: fit.params.UA.stdErr / fit.params.UA.value };
    expect(next.targetParameter).toBe(rel.Ts > rel.UA ? 'Ts' : 'UA');
    expect(next.relativeStdErrNow).toBeCloseTo(Math.max(rel.Ts, rel.UA), 12);
    expect(next.flowM3PerS).toBeLessThan(8 * LPM); // Ts and UA are strongly correlated without low flows: a low flow separates them
    expect(next.flowM3PerS).toBeGreaterThanOrEqual(next.feasibleRangeM3PerS[0]);
    expect(next.piHighC).toBeLessThanOrEqual(95);
    expect(next.stdErrAfter.Ts).toBeLessThan(next.stdErrNow.Ts);
    expect(next.stdErrAfter.UA).toBeLessThan(next.stdErrNow.UA);
  });
  test('the expected errors equal √diag((C⁻¹ + ggᵀ/σ²)⁻¹) computed directly (Sherman–Morrison, closed form)', () => {
    if (!next.ok) throw new Error(next.reason);
    const g = responseAt(builtinResponseModel('coil'), tin)([fit.params.Ts.value, fit.params.UA.value], [next.flowM3PerS]).rows[0];
    const cinv = symmetricInverse(Float64Array.from(fit.covariance.flat()), 2)!;
    const m = Float64Array.from([0, 1, 2, 3], (k) => cinv[k] + (g[Math.floor(k / 2)] * g[k % 2]) / 0.04);
    const after = symmetricInverse(m, 2)!;
    expect(next.stdErrAfter.Ts).toBeCloseTo(Math.sqrt(after[0]), 10);
    expect(next.stdErrAfter.UA).toBeCloseTo(Math.sqrt(after[3]), 8);
  });
  test('no other flow on a fine grid cuts the target more (brute force with the direct inverse)', () => {
    if (!next.ok) throw new Error(next.reason);
    const [lo, hi] = next.feasibleRangeM3PerS;
    const j = next.targetParameter === 'Ts' ? 0 : 3;
    const r = responseAt(builtinResponseModel('coil'), tin);
    const cinv = symmetricInverse(Float64Array.from(fit.covariance.flat()), 2)!;
    for (let i = 0; i <= 300; i++) {
      const g = r([fit.params.Ts.value, fit.params.UA.value], [lo + ((hi - lo) * i) / 300]).rows[0];
      const after = symmetricInverse(Float64Array.from([0, 1, 2, 3], (k) => cinv[k] + (g[Math.floor(k / 2)] * g[k % 2]) / 0.04), 2)!;
      expect(Math.sqrt(after[j])).toBeGreaterThanOrEqual(next.stdErrAfter[next.targetParameter] * (1 - 1e-9));
    }
  });
});

describe('plan command', () => {
  const cli = { model: 'coil', prior: { Ts: '90 degC', UA: '400 W/K' }, inletTemp: '15 degC', flowRange: ['2 L/min', '20 L/min'], maxOutletTemp: '95 degC', trials: 8 };
  test('prints the contract fields', () => {
    const r = run(cli) as Record<string, any>;
    expect(r.runs).toHaveLength(8);
    expect(Object.keys(r.runs[0])).toEqual(['order', 'flow_m3_per_s', 'flow_L_per_min', 'predictedOutletTemp_degC', 'piLow_degC', 'piHigh_degC', 'purpose']);
    expect(r.dEfficiency).toBeGreaterThan(0);
    expect(Object.keys(r.expectedStdErr)).toEqual(['Ts', 'UA']);
    expect(r.evenlySpaced.dEfficiency).toBeLessThan(r.dEfficiency);
    expect(r.seed).toBe(1);
    expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity/);
  });
  test.each([
    [{ ...cli, trials: 100 }, /trials/],
    [{ ...cli, prior: { Ts: '90 degC' } }, /prior.UA/],
    [{ ...cli, prior: { Ts: '90 degC', UA: '400 W' } }, /prior.UA/],
    [{ ...cli, flowRange: ['2 L/min'] }, /flowRange/],
    [{ ...cli, model: 'magic' }, /model/],
  ])('malformed input %# is an InputError', (input, msg) => {
    expect(() => run(input)).toThrow(InputError);
    expect(() => run(input)).toThrow(msg);
  });
});
