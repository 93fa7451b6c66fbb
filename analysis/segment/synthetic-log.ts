/**
 * A synthetic sensor log of steady plateaus joined by first-order transitions, with seeded
 * noise: the fixture and benchmark generator, and a known answer for the segmenter's tests.
 */
import { mulberry32 } from '../fit/random';

/** One set-point held for `durationS`. */
export interface PlateauSpec {
  durationS: number;
  inletTempC: number;
  outletTempC: number;
  flowM3PerS: number;
  ambientTempC?: number;
}

export interface GeneratedLog {
  timeS: Float64Array;
  inletTempC: Float64Array;
  outletTempC: Float64Array;
  flowM3PerS: Float64Array;
  ambientTempC: Float64Array;
  /** index where each plateau's set-point starts */
  plateauStarts: number[];
}

/** The seeded generator of the fitting engine (mulberry32), re-exported for the log generator's callers. */
export { mulberry32 };

/**
 * Samples at `intervalS`; each channel moves to the next plateau's value with time constant
 * `tauS` (the outlet lags like a coil's thermal mass) and carries uniform noise of ± `noise.*`.
 * @example generatePlateauLog([{ durationS: 1200, inletTempC: 15, outletTempC: 40, flowM3PerS: 2.5e-4 }], { intervalS: 1 })
 */
export function generatePlateauLog(
  plateaus: PlateauSpec[],
  options: { intervalS?: number; tauS?: number; seed?: number; noise?: { tempK?: number; flowFraction?: number }; startS?: number } = {},
): GeneratedLog {
  const dt = options.intervalS ?? 1;
  const tau = options.tauS ?? 60;
  const rnd = mulberry32(options.seed ?? 1);
  const nT = options.noise?.tempK ?? 0.02;
  const nQ = options.noise?.flowFraction ?? 0.002;
  const total = plateaus.reduce((a, p) => a + Math.round(p.durationS / dt), 0);
  const g: GeneratedLog = {
    timeS: new Float64Array(total), inletTempC: new Float64Array(total), outletTempC: new Float64Array(total),
    flowM3PerS: new Float64Array(total), ambientTempC: new Float64Array(total), plateauStarts: [],
  };
  const first = plateaus[0];
  let tin = first.inletTempC, tout = first.outletTempC, q = first.flowM3PerS, ta = first.ambientTempC ?? 20;
  const k = 1 - Math.exp(-dt / tau);
  let i = 0;
  for (const p of plateaus) {
    g.plateauStarts.push(i);
    const m = Math.round(p.durationS / dt);
    for (let j = 0; j < m; j++, i++) {
      tin += (p.inletTempC - tin) * k;
      tout += (p.outletTempC - tout) * k;
      q += (p.flowM3PerS - q) * Math.min(1, 4 * k);
      ta += ((p.ambientTempC ?? ta) - ta) * k * 0.1;
      g.timeS[i] = (options.startS ?? 0) + i * dt;
      g.inletTempC[i] = tin + nT * (2 * rnd() - 1);
      g.outletTempC[i] = tout + nT * (2 * rnd() - 1);
      g.flowM3PerS[i] = q * (1 + nQ * (2 * rnd() - 1));
      g.ambientTempC[i] = ta + 0.1 * (2 * rnd() - 1);
    }
  }
  return g;
}
