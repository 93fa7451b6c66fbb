/**
 * Locally D-optimal designs over a finite set of candidate settings, each given by its sensitivity
 * row g = ∂y/∂θ at a prior θ (a nonlinear model linearised at the prior: Box & Lucas, "Design of
 * experiments in non-linear situations", Biometrika 46 (1959) — from memory). The D criterion is
 * det M, M = Σ gᵢgᵢᵀ: the volume of the parameters' joint confidence region shrinks as det M^(−1/2).
 *
 * - {@link approximateDesign}: the optimal weights on the candidates (a "continuous" design) by the
 *   multiplicative algorithm wᵢ ← wᵢ·dᵢ/p, dᵢ = gᵢᵀM⁻¹gᵢ (Silvey, Titterington & Torsney 1978,
 *   from memory), stopped by the Kiefer–Wolfowitz equivalence theorem: a design is D-optimal iff
 *   max dᵢ = p, and p/max dᵢ bounds its D-efficiency from below.
 * - {@link exactDesign}: n runs on the candidates by a Fedorov-type exchange (each run in turn moved to
 *   the candidate that raises det M most, until no move helps), from several seeded starts, under the
 *   session rules of a test plan: a reference pair (the first and last runs at one flow), at least
 *   `minDistinct` distinct settings, and a replicate besides the reference pair.
 * Work is bounded by the caller's candidate count and run count and by the iteration caps here.
 */
import { mulberry32 } from '../fit/random';
import { goldenSectionMax } from '../stats/golden-section';
import { addOuter, informationMatrix, logDet, symmetricInverse, quadraticForm } from './information-matrix';

/** Most multiplicative-algorithm iterations. */
const MAX_ITERATIONS = 20_000;
/** Most exchange passes per start. */
const MAX_PASSES = 100;

/** An approximate (weighted) design. */
export interface ApproximateDesign {
  /** weight of each candidate, summing to 1 */
  weights: number[];
  /** log det of M(w) = Σ wᵢgᵢgᵢᵀ */
  logDet: number;
  /** max over the candidates of gᵀM⁻¹g (= p at the optimum) */
  maxVariance: number;
  iterations: number;
}

/**
 * The D-optimal weights over candidate rows.
 * @param rows candidate sensitivity rows (length p each)
 * @param options.tolerance stop when max dᵢ ≤ p·(1 + tolerance) (default 1e-9)
 * @param options.maxIterations at most this many iterations (default and cap 20,000)
 * @returns the design, or null when no weighting makes M non-singular (fewer than p independent rows)
 * @example approximateDesign([[1, 0], [1, 1], [1, 2]])?.weights // [0.5, 0, 0.5]
 */
export function approximateDesign(rows: number[][], options: { tolerance?: number; maxIterations?: number } = {}): ApproximateDesign | null {
  const k = rows.length;
  const p = rows[0]?.length ?? 0;
  if (k < p || p === 0) return null;
  const tol = options.tolerance ?? 1e-9;
  let w = new Array<number>(k).fill(1 / k);
  const d = new Array<number>(k);
  let it = 0;
  let maxD = Infinity;
  const cap = Math.min(options.maxIterations ?? MAX_ITERATIONS, MAX_ITERATIONS);
  for (; it < cap; it++) {
    const inv = symmetricInverse(informationMatrix(rows, p, w), p);
    if (!inv) return null;
    maxD = 0;
    for (let i = 0; i < k; i++) {
      d[i] = quadraticForm(inv, rows[i]);
      maxD = Math.max(maxD, d[i]);
    }
    if (maxD <= p * (1 + tol)) break;
    w = w.map((wi, i) => (wi * d[i]) / p);
  }
  return { weights: w, logDet: logDet(informationMatrix(rows, p, w), p), maxVariance: maxD, iterations: it };
}

/** An approximate design over a continuous range, its support points refined off the grid. */
export interface RangeDesign {
  /** support points (unit of x) with their weights, ascending */
  points: { x: number; weight: number }[];
  logDet: number;
  /** max of gᵀM⁻¹g over the grid at the final design (≈ p when optimal) */
  maxVariance: number;
}

/**
 * The D-optimal approximate design for x in [a, b]: {@link approximateDesign} on an evenly spaced
 * grid, then the support refined off the grid — the clusters of weighted grid points become points
 * whose positions (golden-section search within a grid step of the cluster) and weights (the
 * multiplicative algorithm on those points) are improved in turn. A saturated design (p points)
 * ends with equal weights 1/p, as a saturated D-optimal design must (Silvey, "Optimal Design",
 * 1980 — from memory; it follows from maximising Π wᵢ · det(G)² subject to Σ wᵢ = 1).
 * @param rowAt sensitivity row at x
 * @param range [a, b], a < b
 * @param gridPoints grid size (default 201)
 * @returns the design, or null when M is singular for every weighting
 * @example approximateDesignOnRange((x) => [x / (1 + x), -x / (1 + x) ** 2], [0, 4])?.points // x ≈ 0.667, 4
 */
export function approximateDesignOnRange(rowAt: (x: number) => number[], range: [number, number], gridPoints = 201): RangeDesign | null {
  const [a, b] = range;
  const xs = Array.from({ length: gridPoints }, (_, i) => a + ((b - a) * i) / (gridPoints - 1));
  const rows = xs.map(rowAt);
  const p = rows[0].length;
  const approx = approximateDesign(rows, { tolerance: 1e-6, maxIterations: 3000 });
  if (!approx) return null;
  // clusters of neighbouring grid points that carry weight
  const clusters: { lo: number; hi: number; x: number; weight: number }[] = [];
  approx.weights.forEach((w, i) => {
    if (w < 1e-4) return;
    const last = clusters[clusters.length - 1];
    if (last && i - last.hi <= 1) {
      last.x = (last.x * last.weight + xs[i] * w) / (last.weight + w);
      last.weight += w;
      last.hi = i;
    } else clusters.push({ lo: i, hi: i, x: xs[i], weight: w });
  });
  const step = (b - a) / (gridPoints - 1);
  const x = clusters.map((c) => c.x);
  let w = clusters.map((c) => c.weight);
  const value = () => logDet(informationMatrix(x.map(rowAt), p, w), p);
  for (let sweep = 0; sweep < 4; sweep++) {
    const fw = approximateDesign(x.map(rowAt), { tolerance: 1e-12 });
    if (fw) w = fw.weights;
    clusters.forEach((c, j) => {
      const f = (v: number) => { x[j] = v; return value(); };
      let bestX = goldenSectionMax(f, Math.max(a, xs[c.lo] - step), Math.min(b, xs[c.hi] + step), { maxIterations: 60 });
      let bestV = f(bestX);
      for (const e of [a, b]) if (Math.abs(e - bestX) <= 2 * step) { const ve = f(e); if (ve > bestV) { bestV = ve; bestX = e; } }
      x[j] = bestX;
    });
  }
  const refinedLogDet = value();
  const points = refinedLogDet >= approx.logDet
    ? x.map((v, j) => ({ x: v, weight: w[j] }))
    : approx.weights.flatMap((wi, i) => (wi >= 1e-4 ? [{ x: xs[i], weight: wi }] : []));
  const m = informationMatrix(points.map((q) => rowAt(q.x)), p, points.map((q) => q.weight));
  const inv = symmetricInverse(m, p);
  const maxVariance = inv ? Math.max(...rows.map((g) => quadraticForm(inv, g)), ...points.map((q) => quadraticForm(inv, rowAt(q.x)))) : Infinity;
  return { points: points.sort((u, v) => u.x - v.x), logDet: Math.max(refinedLogDet, approx.logDet), maxVariance };
}

/** Session rules of an exact design. */
export interface ExactDesignRules {
  /** the first and last runs share one setting (a reference for drift); default false */
  referencePair?: boolean;
  /** at least this many distinct settings (default 1) */
  minDistinct?: number;
  /** some setting is run twice besides the reference pair (default false) */
  requireReplicate?: boolean;
  /** random starts besides the structured one (default 8) */
  starts?: number;
}

/** An exact design: which candidate each run uses. */
export interface ExactDesign {
  /** candidate index per run, in slot order (with a reference pair: first and last are the reference) */
  indices: number[];
  logDet: number;
}

function satisfies(idx: number[], r: Required<ExactDesignRules>): boolean {
  const seen = new Map<number, number>();
  for (const i of idx) seen.set(i, (seen.get(i) ?? 0) + 1);
  if (seen.size < r.minDistinct) return false;
  if (!r.requireReplicate) return true;
  const need = r.referencePair ? 3 : 2; // the reference flow counts as a replicate only when run a third time
  for (const [i, c] of seen) if (c >= (r.referencePair && i === idx[0] ? need : 2)) return true;
  return false;
}

/**
 * n runs maximising det M over the candidates under the rules.
 * @param rows candidate sensitivity rows
 * @param n number of runs (≥ p; with the rules, enough runs to meet them)
 * @param rules see {@link ExactDesignRules}
 * @returns the best design found, or null when the rules cannot be met or M is always singular
 * @throws RangeError when n or the rules are not positive integers
 * @example exactDesign([[1, 0], [1, 1], [1, 2]], 2)?.indices // [0, 2]
 */
export function exactDesign(rows: number[][], n: number, rules: ExactDesignRules = {}): ExactDesign | null {
  const r: Required<ExactDesignRules> = { referencePair: false, minDistinct: 1, requireReplicate: false, starts: 8, ...rules };
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`n must be a positive integer, got ${n}`);
  if (!Number.isInteger(r.minDistinct) || r.minDistinct < 1) throw new RangeError(`minDistinct must be a positive integer, got ${r.minDistinct}`);
  const k = rows.length;
  const p = rows[0]?.length ?? 0;
  if (k < r.minDistinct || n < p) return null;
  const rand = mulberry32(0x5eed);
  const score = (idx: number[]) => (satisfies(idx, r) ? logDet(informationMatrix(idx.map((i) => rows[i]), p), p) : -Infinity);
  let best: ExactDesign | null = null;
  for (let s = 0; s <= r.starts; s++) {
    const idx = start(k, n, r, s === 0 ? null : rand);
    let current = score(idx);
    for (let pass = 0; pass < MAX_PASSES; pass++) {
      let improved = false;
      // slots: the reference pair moves as one (slot 0 with its twin at n − 1)
      for (let slot = 0; slot < (r.referencePair ? n - 1 : n); slot++) {
        const old = idx[slot];
        let bestC = old;
        let bestV = current;
        const m = informationMatrix(idx.map((i) => rows[i]), p);
        const mult = r.referencePair && slot === 0 ? 2 : 1;
        addOuter(m, rows[old], -mult);
        for (let c = 0; c < k; c++) {
          if (c === old) continue;
          idx[slot] = c;
          if (mult === 2) idx[n - 1] = c;
          if (!satisfies(idx, r)) continue;
          const trial = Float64Array.from(m);
          addOuter(trial, rows[c], mult);
          const v = logDet(trial, p);
          if (v > bestV + 1e-12 * Math.max(1, Math.abs(bestV))) {
            bestV = v;
            bestC = c;
          }
        }
        idx[slot] = bestC;
        if (mult === 2) idx[n - 1] = bestC;
        if (bestC !== old) {
          current = bestV;
          improved = true;
        }
      }
      if (!improved) break;
    }
    if (Number.isFinite(current) && (best === null || current > best.logDet)) best = { indices: idx.slice(), logDet: current };
  }
  return best;
}

/** A starting design that meets the rules: `minDistinct` spread (or random) settings, then repeats. */
function start(k: number, n: number, r: Required<ExactDesignRules>, rand: (() => number) | null): number[] {
  const levels = Math.min(k, Math.max(r.minDistinct, 2));
  const picks: number[] = [];
  if (rand === null) {
    for (let j = 0; j < levels; j++) picks.push(Math.round((j * (k - 1)) / Math.max(1, levels - 1)));
  } else {
    while (picks.length < levels) {
      const c = Math.floor(rand() * k);
      if (!picks.includes(c)) picks.push(c);
    }
  }
  const idx: number[] = [];
  if (r.referencePair) {
    idx.push(picks[0]);
    for (let j = 0; j < n - 2; j++) idx.push(picks[(j + 1) % picks.length]);
    idx.push(picks[0]);
  } else {
    for (let j = 0; j < n; j++) idx.push(picks[j % picks.length]);
  }
  return idx;
}
