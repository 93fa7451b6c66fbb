/**
 * First-order uncertainty propagation after JCGM 100:2008 (the GUM) as adapted in NIST TN 1297:
 *     u_c²(y) = Σ c_i² u_i² + 2 Σ_{i<j} c_i c_j r_ij u_i u_j,   c_i = ∂f/∂x_i
 *     ν_eff = u_c⁴ / Σ (c_i u_i)⁴/ν_i   (Welch–Satterthwaite),   U = k·u_c,
 * with k the Student-t quantile t_{(1+p)/2}(ν_eff) unless a fixed k is given. Sensitivities are
 * central differences of `f`. Helpers for Type A (s/√n), rectangular (a/√3) and certificate
 * (U/k) standard uncertainties.
 */
import { studentTQuantile } from '../stats/distributions';
import { requireFinite, requireInRange, requireNonNegative, requirePositive } from '../units/guards';

/** One input quantity of a budget. */
export interface BudgetInput {
  name: string;
  /** best estimate, in the unit given by `unit` */
  value: number;
  /** standard uncertainty, same unit, ≥ 0 */
  u: number;
  /** degrees of freedom (Infinity for a Type B estimate taken as exact; the default) */
  dof?: number;
  /** how u was obtained, for the table: 'normal', 'rectangular', 'type A', 'certificate'… */
  distribution?: string;
  unit?: string;
}

/** A correlation coefficient between two inputs named in the budget. */
export interface BudgetCorrelation {
  a: string;
  b: string;
  /** r in [−1, 1] */
  r: number;
}

/** One row of the contribution table. */
export interface BudgetRow {
  name: string;
  value: number;
  u: number;
  unit: string;
  distribution: string;
  dof: number;
  /** sensitivity coefficient ∂f/∂x */
  sensitivity: number;
  /** |c·u|, in the unit of y */
  contribution: number;
  /** share of u_c² (uncorrelated part), percent; correlation rows may be negative */
  percent: number;
}

/** A complete budget. */
export interface Budget {
  value: number;
  uc: number;
  /** u_c / |y| */
  ucRelative: number;
  nuEff: number;
  k: number;
  /** expanded uncertainty U = k·u_c */
  U: number;
  level: number;
  rows: BudgetRow[];
}

/**
 * Evaluates a GUM budget for y = f(x).
 * @param f the measurement function, taking the input values in budget order
 * @param inputs the input quantities
 * @param options correlations; `level` (default 0.95) for k from ν_eff; or a fixed `k`
 * @throws TypeError / RangeError for non-finite values, negative u, unknown correlation names,
 *   |r| > 1, or an f that returns a non-finite value.
 * @example gumBudget(([a, b]) => a * b, [{ name: 'a', value: 2, u: 0.1 }, { name: 'b', value: 3, u: 0.2 }]).uc // 0.5
 */
export function gumBudget(
  f: (x: number[]) => number,
  inputs: BudgetInput[],
  options: { correlations?: BudgetCorrelation[]; level?: number; k?: number } = {},
): Budget {
  if (!Array.isArray(inputs) || inputs.length === 0) throw new RangeError('inputs must list at least one quantity');
  const x = inputs.map((q, i) => requireFinite(q.value, `inputs[${i}].value (${q.name})`));
  const u = inputs.map((q, i) => requireNonNegative(q.u, `inputs[${i}].u (${q.name})`));
  const dof = inputs.map((q, i) => (q.dof === undefined ? Infinity : requirePositive(q.dof, `inputs[${i}].dof (${q.name})`)));
  const level = requireInRange(options.level ?? 0.95, 'level', 0.5, 0.9999);
  const y = f(x);
  if (!Number.isFinite(y)) throw new RangeError(`the measurement function is not finite at the input values (got ${y})`);
  const c = x.map((xi, i) => {
    const h = u[i] > 0 ? u[i] * 1e-3 : Math.max(Math.abs(xi) * 1e-7, 1e-12);
    const xp = x.slice(); xp[i] = xi + h;
    const xm = x.slice(); xm[i] = xi - h;
    const d = (f(xp) - f(xm)) / (2 * h);
    if (!Number.isFinite(d)) throw new RangeError(`sensitivity to ${inputs[i].name} is not finite`);
    return d;
  });
  const ci = c.map((ci0, i) => ci0 * u[i]);
  let uc2 = ci.reduce((s, v) => s + v * v, 0);
  const corrRows: BudgetRow[] = [];
  for (const cor of options.correlations ?? []) {
    const ia = inputs.findIndex((q) => q.name === cor.a);
    const ib = inputs.findIndex((q) => q.name === cor.b);
    if (ia < 0 || ib < 0 || ia === ib) throw new RangeError(`correlation names must be two different inputs, got ${cor.a} and ${cor.b}`);
    const r = requireInRange(cor.r, `correlation ${cor.a}–${cor.b}`, -1, 1);
    const term = 2 * r * ci[ia] * ci[ib];
    uc2 += term;
    corrRows.push({
      name: `correlation ${cor.a}–${cor.b}`, value: r, u: 0, unit: '', distribution: 'correlation', dof: Infinity,
      sensitivity: 0, contribution: Math.sign(term) * Math.sqrt(Math.abs(term)), percent: term,
    });
  }
  uc2 = Math.max(uc2, 0);
  const uc = Math.sqrt(uc2);
  let denom = 0;
  ci.forEach((v, i) => { if (Number.isFinite(dof[i])) denom += v ** 4 / dof[i]; });
  const nuEff = denom > 0 ? uc2 * uc2 / denom : Infinity;
  const k = options.k !== undefined ? requirePositive(options.k, 'k') : studentTQuantile((1 + level) / 2, nuEff > 1e7 ? Infinity : Math.max(nuEff, 1e-9));
  const rows: BudgetRow[] = inputs.map((q, i) => ({
    name: q.name, value: x[i], u: u[i], unit: q.unit ?? '', distribution: q.distribution ?? 'normal', dof: dof[i],
    sensitivity: c[i], contribution: Math.abs(ci[i]), percent: uc2 > 0 ? (100 * ci[i] * ci[i]) / uc2 : 0,
  }));
  for (const r of corrRows) r.percent = uc2 > 0 ? (100 * r.percent) / uc2 : 0;
  return { value: y, uc, ucRelative: y !== 0 ? uc / Math.abs(y) : Infinity, nuEff, k, U: k * uc, level, rows: [...rows, ...corrRows] };
}

/**
 * Standard uncertainty of a rectangular (uniform) distribution of half-width a: a/√3.
 * @throws RangeError for a < 0.
 * @example rectangularU(1.0) // 0.57735
 */
export function rectangularU(halfWidth: number): number {
  return requireNonNegative(halfWidth, 'halfWidth') / Math.sqrt(3);
}

/**
 * Standard uncertainty from an expanded certificate value: U/k.
 * @example certificateU(0.2, 2) // 0.1
 */
export function certificateU(expanded: number, k: number): number {
  return requireNonNegative(expanded, 'expanded') / requirePositive(k, 'k');
}
