import { extent } from '../stats/extent';
import { linearLeastSquares } from './linear-least-squares';
import { trialWaterProperties } from '../water/trial-water';

/** Data a built-in start-value rule sees (covariates already filled with their defaults). */
export interface StartData {
  x: Float64Array;
  y: Float64Array;
  covariates: Record<string, Float64Array>;
}

/** A built-in model: its expression, parameters with units, covariates and automatic start rule. */
export interface BuiltinModel {
  name: string;
  description: string;
  expression: string;
  parameters: string[];
  parameterUnits: Record<string, string>;
  /** covariates the model needs on every point */
  requiredCovariates: string[];
  /**
   * covariates computed from the data when the input does not give them, with the words that
   * say how (the coil's rho and cp: IAPWS-IF97 at each trial's temperatures)
   */
  derivedCovariates?: { names: string[]; how: Record<string, string>; derive(data: StartData): Record<string, Float64Array> };
  /** what the data must satisfy, in words, shown when the model cannot be evaluated */
  requirement?: string;
  /** every x must be > 0 (flows for the coil; the power law) */
  positiveX?: boolean;
  /** polynomial degree when the model is linear in its parameters */
  polynomialDegree?: number;
  /** candidate starting points, best first (empty when no rule applies) */
  starts(data: StartData): number[][];
}

/**
 * The coil's rho and cp when the input does not give them: the trial water properties of every
 * point (analysis/water/trial-water.ts: ρ at the outlet, the bucket's water; cp at the mean of
 * inlet and outlet), the same rule as the `coil` command, so UA agrees between the two.
 * @throws RangeError naming the point whose temperature is outside liquid water at 1 atm.
 */
function coilWater({ y, covariates }: StartData): Record<string, Float64Array> {
  const tin = covariates.Tin;
  const rho = new Float64Array(y.length), cp = new Float64Array(y.length);
  for (let i = 0; i < y.length; i++) {
    const w = trialWaterProperties(tin[i], y[i], 'outlet', { inlet: `covariates.Tin[${i}]`, outlet: `y[${i}]` });
    rho[i] = w.densityKgPerM3;
    cp[i] = w.cpJPerKgK;
  }
  return { rho, cp };
}

const mean = (v: ArrayLike<number>) => {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i];
  return s / v.length;
};
const max = (v: ArrayLike<number>) => extent(v)[1];
const min = (v: ArrayLike<number>) => extent(v)[0];

/** Rates k to try for exp(−k·x): spread over three decades around 1/(x range). */
function rateGrid(x: Float64Array): number[] {
  const span = max(x) - min(x) || Math.abs(max(x)) || 1;
  return [0.05, 0.1, 0.2, 0.35, 0.5, 0.75, 1, 1.5, 2, 3, 5, 8, 12, 20].map((c) => c / span);
}

function coilStarts({ x, y, covariates }: StartData): number[][] {
  const tin = covariates.Tin;
  const rho = covariates.rho;
  const cp = covariates.cp;
  const tMax = max(y);
  const spread = Math.max(tMax - mean(tin), 1);
  const scored: { rss: number; p: number[] }[] = [];
  for (const c of [0.003, 0.01, 0.03, 0.1, 0.3, 1, 3]) {
    const ts = tMax + c * spread;
    // §1.5(a): with Ts fixed, −ln[(Ts − Tout)/(Ts − Tin)] = UA · 1/(ṁ cp), a regression through the origin
    let szu = 0;
    let suu = 0;
    for (let i = 0; i < x.length; i++) {
      const ratio = (ts - y[i]) / (ts - tin[i]);
      if (!(ratio > 0 && ratio < 1) || !(x[i] > 0)) continue;
      const u = 1 / (rho[i] * x[i] * cp[i]);
      szu += -Math.log(ratio) * u;
      suu += u * u;
    }
    if (!(suu > 0) || !(szu > 0)) continue;
    const ua = szu / suu;
    let rss = 0;
    for (let i = 0; i < x.length; i++) {
      const f = ts - (ts - tin[i]) * Math.exp(-ua / (rho[i] * x[i] * cp[i]));
      rss += (f - y[i]) ** 2;
    }
    if (Number.isFinite(rss)) scored.push({ rss, p: [ts, ua] });
  }
  return scored.sort((a, b) => a.rss - b.rss).map((s) => s.p);
}

function expApproachStarts({ x, y }: StartData): number[][] {
  const scored: { rss: number; p: number[] }[] = [];
  for (const k of rateGrid(x)) {
    const e = Array.from(x, (xi) => Math.exp(-k * xi));
    const r = linearLeastSquares([new Float64Array(x.length).fill(1), e], y);
    if (r.ok) scored.push({ rss: r.rss, p: [r.coefficients[0], r.coefficients[1], k] });
  }
  return scored.sort((a, b) => a.rss - b.rss).map((s) => s.p);
}

function expInletStarts({ x, y, covariates }: StartData): number[][] {
  const tin = covariates.Tin;
  const scored: { rss: number; p: number[] }[] = [];
  for (const k of rateGrid(x)) {
    let sde = 0;
    let see = 0;
    for (let i = 0; i < x.length; i++) {
      const e = Math.exp(-k * x[i]);
      sde += (y[i] - tin[i]) * e;
      see += e * e;
    }
    if (!(see > 0)) continue;
    const a = sde / see;
    let rss = 0;
    for (let i = 0; i < x.length; i++) rss += (tin[i] + a * Math.exp(-k * x[i]) - y[i]) ** 2;
    if (Number.isFinite(rss)) scored.push({ rss, p: [a, k] });
  }
  return scored.sort((a, b) => a.rss - b.rss).map((s) => s.p);
}

function powerStarts({ x, y }: StartData): number[][] {
  const ok = Array.from(x).every((v, i) => v > 0 && y[i] > 0);
  if (ok) {
    const r = linearLeastSquares([new Float64Array(x.length).fill(1), Array.from(x, Math.log)], Array.from(y, Math.log));
    if (r.ok) return [[Math.exp(r.coefficients[0]), r.coefficients[1]]];
  }
  return [[mean(y) || 1, 1]];
}

const HEATER = 'x: volume flow (m³/s); y: outlet temperature (°C)';

/** The built-in models by name. */
export const BUILTIN_MODELS: Record<string, BuiltinModel> = {
  coil: {
    name: 'coil',
    description: `constant-source coil, effectiveness–NTU with Cr → 0: Tout = Ts − (Ts − Tin)·exp(−UA/(ρ·x·cp)); ${HEATER}`,
    expression: 'Ts - (Ts - Tin) * exp(-UA / (rho * x * cp))',
    parameters: ['Ts', 'UA'],
    parameterUnits: { Ts: '°C', UA: 'W/K' },
    requirement: 'the coil model needs every flow x > 0 (m³/s)',
    positiveX: true,
    requiredCovariates: ['Tin'],
    derivedCovariates: {
      names: ['rho', 'cp'],
      how: { rho: 'IAPWS-IF97 density at each outlet temperature (the bucket holds outlet water)', cp: 'IAPWS-IF97 cp at the mean of each inlet and outlet temperature' },
      derive: coilWater,
    },
    starts: coilStarts,
  },
  'exp-approach': {
    name: 'exp-approach',
    description: `exponential approach to an asymptote: Tout = Tinf + A·exp(−k·x); ${HEATER}`,
    expression: 'Tinf + A * exp(-k * x)',
    parameters: ['Tinf', 'A', 'k'],
    parameterUnits: { Tinf: '°C', A: 'K', k: 's/m³' },
    requiredCovariates: [],
    starts: expApproachStarts,
  },
  'exp-inlet': {
    name: 'exp-inlet',
    description: `exponential decay toward the inlet temperature: Tout = Tin + A·exp(−k·x); ${HEATER}`,
    expression: 'Tin + A * exp(-k * x)',
    parameters: ['A', 'k'],
    parameterUnits: { A: 'K', k: 's/m³' },
    requiredCovariates: ['Tin'],
    starts: expInletStarts,
  },
  poly1: polynomial(1),
  poly2: polynomial(2),
  poly3: polynomial(3),
  power: {
    name: 'power',
    description: 'power law y = a·x^b (x > 0)',
    requirement: 'the power law needs every x > 0',
    positiveX: true,
    expression: 'a * x ^ b',
    parameters: ['a', 'b'],
    parameterUnits: { a: 'unit of y per (unit of x)^b', b: '1' },
    requiredCovariates: [],
    starts: powerStarts,
  },
};

function polynomial(degree: number): BuiltinModel {
  const parameters = Array.from({ length: degree + 1 }, (_, k) => `b${k}`);
  const terms = parameters.map((b, k) => (k === 0 ? b : k === 1 ? `${b} * x` : `${b} * x ^ ${k}`));
  return {
    name: `poly${degree}`,
    description: `polynomial of degree ${degree} in x, solved by QR`,
    expression: terms.join(' + '),
    parameters,
    parameterUnits: Object.fromEntries(parameters.map((b, k) => [b, `unit of y per (unit of x)^${k}`])),
    requiredCovariates: [],
    polynomialDegree: degree,
    starts: () => [],
  };
}
