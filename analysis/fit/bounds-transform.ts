/**
 * Maps between bounded parameters p and unbounded internal variables u, so that an unconstrained
 * solver respects bounds: p = lo + (hi − lo)(sin u + 1)/2 with both bounds, p = lo − 1 + √(u² + 1)
 * with a lower bound only, p = hi + 1 − √(u² + 1) with an upper bound only (the transformation used
 * by MINUIT, F. James, CERN Program Library D506, §1.3).
 */
export interface BoundsTransform {
  toInternal(p: ArrayLike<number>): Float64Array;
  toExternal(u: ArrayLike<number>, out: Float64Array): void;
  /** dp_j/du_j at u */
  derivative(u: ArrayLike<number>, out: Float64Array): void;
  /** true when no parameter has a finite bound */
  identity: boolean;
}

/**
 * Builds the transform for the given bounds; starting values outside or on a bound are moved just inside.
 * @param bounds - per parameter [low, high], ±Infinity for none
 * @returns the transform
 * @example boundsTransform([[0, Infinity]]).toInternal([0]) // [0]
 */
export function boundsTransform(bounds: [number, number][]): BoundsTransform {
  const n = bounds.length;
  const kind = bounds.map(([lo, hi]) => (Number.isFinite(lo) && Number.isFinite(hi) ? 3 : Number.isFinite(lo) ? 1 : Number.isFinite(hi) ? 2 : 0));
  return {
    identity: kind.every((k) => k === 0),
    toInternal(p) {
      const u = new Float64Array(n);
      for (let j = 0; j < n; j++) {
        const [lo, hi] = bounds[j];
        // a start on a bound sits where dp/du = 0 and the solver could not move it: nudge it inside
        const gap = kind[j] === 3 ? 1e-3 * (hi - lo) : 1e-3 * Math.max(1, Math.abs(Number.isFinite(lo) ? lo : hi));
        const v = Math.min(Math.max(p[j], lo + (kind[j] === 1 || kind[j] === 3 ? gap : 0)), hi - (kind[j] === 2 || kind[j] === 3 ? gap : 0));
        if (kind[j] === 3) u[j] = Math.asin(Math.min(1, Math.max(-1, (2 * (v - lo)) / (hi - lo) - 1)));
        else if (kind[j] === 1) u[j] = Math.sqrt((v - lo + 1) ** 2 - 1);
        else if (kind[j] === 2) u[j] = Math.sqrt((hi - v + 1) ** 2 - 1);
        else u[j] = v;
      }
      return u;
    },
    toExternal(u, out) {
      for (let j = 0; j < n; j++) {
        const [lo, hi] = bounds[j];
        if (kind[j] === 3) out[j] = lo + ((hi - lo) * (Math.sin(u[j]) + 1)) / 2;
        else if (kind[j] === 1) out[j] = lo - 1 + Math.sqrt(u[j] * u[j] + 1);
        else if (kind[j] === 2) out[j] = hi + 1 - Math.sqrt(u[j] * u[j] + 1);
        else out[j] = u[j];
      }
    },
    derivative(u, out) {
      for (let j = 0; j < n; j++) {
        const [lo, hi] = bounds[j];
        if (kind[j] === 3) out[j] = ((hi - lo) * Math.cos(u[j])) / 2;
        else if (kind[j] === 1) out[j] = u[j] / Math.sqrt(u[j] * u[j] + 1);
        else if (kind[j] === 2) out[j] = -u[j] / Math.sqrt(u[j] * u[j] + 1);
        else out[j] = 1;
      }
    },
  };
}
