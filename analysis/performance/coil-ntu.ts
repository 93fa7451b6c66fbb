/**
 * The coil in a constant-temperature source: effectiveness–NTU in the Cr → 0 limit
 * (any heat-transfer text; DOMAIN.md §1.2):
 *     NTU = UA/(ṁ·cp),  ε = 1 − exp(−NTU),  Tout = Ts − (Ts − Tin)·exp(−NTU),  q = ε·ṁ·cp·(Ts − Tin).
 */
import { requireFinite, requireInRange, requireNonNegative, requirePositive } from '../units/guards';
import { temperatureCautions, type Caution } from '../safety/cautions';

/**
 * The hottest effective source temperature the coil relations accept, °C. The water side is
 * liquid water (IAPWS-IF97 region 1 reaches 350 °C, under pressure); an effective source far
 * beyond that no longer describes a coil heating liquid water, and it only makes the arithmetic
 * overflow. Our bound; the lower one is the freezing point (a source colder than the water's
 * freezing point heats nothing).
 */
export const MAX_SOURCE_TEMP_C = 1000;

/**
 * Checks an effective source temperature.
 * @throws TypeError when not finite; RangeError outside 0…{@link MAX_SOURCE_TEMP_C} °C, naming `field`.
 * @example requireSourceTempC(88) // 88
 */
export function requireSourceTempC(value: unknown, field = 'sourceTempC'): number {
  return requireInRange(value, field, 0, MAX_SOURCE_TEMP_C);
}

/** Inputs of the coil relations, SI. */
export interface CoilState {
  /** effective source temperature Ts, °C */
  sourceTempC: number;
  /** water inlet temperature Tin, °C */
  inletTempC: number;
  /** conductance UA, W/K, > 0 */
  uaWPerK: number;
  /** water mass flow ṁ, kg/s, > 0 */
  massFlowKgPerS: number;
  /** water specific heat cp, J/(kg·K), > 0 */
  cpJPerKgK: number;
}

/** Results of the coil relations. */
export interface CoilResult {
  ntu: number;
  effectiveness: number;
  outletTempC: number;
  /** heat delivered to the water, W (negative if the source is colder than the inlet) */
  heatW: number;
  /** the ceiling UA·(Ts − Tin) approached at infinite flow, W */
  heatCeilingW: number;
  /** cautions on the outlet temperature */
  cautions: Caution[];
}

/**
 * Evaluates the ε-NTU coil.
 * @throws TypeError for non-finite inputs; RangeError for UA, ṁ or cp ≤ 0, or a source
 *   temperature outside 0…{@link MAX_SOURCE_TEMP_C} °C.
 * @example coilPerformance({ sourceTempC: 88, inletTempC: 17.5, uaWPerK: 430, massFlowKgPerS: 0.15, cpJPerKgK: 4180 })
 *   // { effectiveness: 0.4963, outletTempC: 52.49, heatW: 21939, heatCeilingW: 30315, … } (the demo lab's Stovepipe Coil A)
 */
export function coilPerformance(s: CoilState): CoilResult {
  const Ts = requireSourceTempC(s.sourceTempC);
  const Tin = requireFinite(s.inletTempC, 'inletTempC');
  const ua = requirePositive(s.uaWPerK, 'uaWPerK');
  const m = requirePositive(s.massFlowKgPerS, 'massFlowKgPerS');
  const cp = requirePositive(s.cpJPerKgK, 'cpJPerKgK');
  const C = m * cp;
  const ntu = ua / C;
  const eps = -Math.expm1(-ntu);
  const outletTempC = Ts - (Ts - Tin) * Math.exp(-ntu);
  return {
    ntu,
    effectiveness: eps,
    outletTempC,
    cautions: temperatureCautions(outletTempC, 'outlet'),
    heatW: eps * C * (Ts - Tin),
    heatCeilingW: ua * (Ts - Tin),
  };
}

/**
 * The fraction of the heat ceiling reached, q/q∞ = (1 − e^(−N))/N, and its inverse: the NTU at
 * which a chosen fraction is reached (0.9 → N = 0.2146, 0.95 → N = 0.1035; DOMAIN.md §1.2).
 * @param fraction target fraction of UA·(Ts − Tin), strictly between 0 and 1
 * @returns NTU, dimensionless
 * @throws RangeError unless 0 < fraction < 1.
 * @example ntuForCeilingFraction(0.8) // 0.4642
 */
export function ntuForCeilingFraction(fraction: number): number {
  requireFinite(fraction, 'fraction');
  if (!(fraction > 0 && fraction < 1)) throw new RangeError(`fraction must be between 0 and 1 (exclusive), got ${fraction}`);
  // g(N) = (1 − e^−N)/N decreases from 1 (N→0) to 0; solve g(N) = fraction by Newton on a bracket.
  let lo = 0, hi = 1;
  while (-Math.expm1(-hi) / hi > fraction) hi *= 2;
  let N = (lo + hi) / 2;
  for (let i = 0; i < 200; i++) {
    const g = -Math.expm1(-N) / N - fraction;
    if (Math.abs(g) < 1e-15) break;
    if (g > 0) lo = N; else hi = N;
    const dg = (Math.exp(-N) * (1 + N) - 1) / (N * N);
    const next = N - g / dg;
    N = next > lo && next < hi ? next : (lo + hi) / 2;
  }
  return N;
}

/**
 * Minimum mass flow keeping the outlet at or below a limit (DOMAIN.md §1.6):
 * ṁ_min = UA / (cp · ln[(Ts − Tin)/(Ts − T_lim)]).
 * @returns kg/s; 0 when Ts ≤ T_lim (no flow can push the outlet past the limit)
 * @throws RangeError when Tin ≥ T_lim (the inlet is already at or above the limit), or for
 *   UA/cp ≤ 0; TypeError for non-finite input.
 * @example minimumMassFlowKgPerS({ sourceTempC: 135, inletTempC: 17.5, limitTempC: 60, uaWPerK: 260, cpJPerKgK: 4180 }) // ≈ 0.1385 (the demo lab's Blue Ring Burner Loop)
 */
export function minimumMassFlowKgPerS(o: {
  sourceTempC: number; inletTempC: number; limitTempC: number; uaWPerK: number; cpJPerKgK: number;
}): number {
  const Ts = requireSourceTempC(o.sourceTempC);
  const Tin = requireFinite(o.inletTempC, 'inletTempC');
  const Tl = requireFinite(o.limitTempC, 'limitTempC');
  const ua = requirePositive(o.uaWPerK, 'uaWPerK');
  const cp = requirePositive(o.cpJPerKgK, 'cpJPerKgK');
  if (!(Tin < Tl)) throw new RangeError(`inletTempC (${Tin}) must be below limitTempC (${Tl}) for a minimum flow to exist`);
  if (Ts <= Tl) return 0;
  return ua / (cp * Math.log((Ts - Tin) / (Ts - Tl)));
}

/**
 * UA of one trial with a known source temperature: UA = −ṁ·cp·ln[(Ts − Tout)/(Ts − Tin)]
 * (DOMAIN.md §1.5 a).
 * @returns W/K
 * @throws RangeError unless Tin < Tout < Ts; TypeError for non-finite input.
 * @example trialUaWPerK({ sourceTempC: 88, inletTempC: 17.5, outletTempC: 50, massFlowKgPerS: 0.15, cpJPerKgK: 4180 }) // ≈ 387.5
 */
export function trialUaWPerK(o: {
  sourceTempC: number; inletTempC: number; outletTempC: number; massFlowKgPerS: number; cpJPerKgK: number;
}): number {
  const Ts = requireSourceTempC(o.sourceTempC);
  const Tin = requireFinite(o.inletTempC, 'inletTempC');
  const Tout = requireFinite(o.outletTempC, 'outletTempC');
  const m = requireNonNegative(o.massFlowKgPerS, 'massFlowKgPerS');
  const cp = requirePositive(o.cpJPerKgK, 'cpJPerKgK');
  if (!(Tout > Tin)) throw new RangeError(`outletTempC (${Tout}) must be above inletTempC (${Tin}) for a heater`);
  if (!(Ts > Tout)) throw new RangeError(`sourceTempC (${Ts}) must be above outletTempC (${Tout}) to derive UA`);
  return -m * cp * Math.log((Ts - Tout) / (Ts - Tin));
}
