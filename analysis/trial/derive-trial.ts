/**
 * Derived quantities of one steady trial (DOMAIN.md §1.1, §1.5): mass flow with the density of
 * the water whose volume was measured (bucket water is outlet water, so ρ(Tout) by default),
 * ΔT, heat rate q = ṁ·cp·ΔT with cp at the mean water temperature, effectiveness and UA when the
 * source temperature is known, and the temperature cautions of the outlet.
 */
import { requireFinite, requireNonNegative, requirePositive } from '../units/guards';
import { trialWaterProperties } from '../water/trial-water';
import { trialUaWPerK } from '../performance/coil-ntu';
import { deadHeadingCaution, mergeCautions, temperatureCautions, type Caution } from '../safety/cautions';

/** Inputs of one trial. */
export interface TrialInput {
  /** measured volume flow, m³/s (0 is allowed and raises the dead-heading caution) */
  flowM3PerS: number;
  /** inlet water temperature, °C */
  inletTempC: number;
  /** outlet water temperature, °C; must not be below the inlet (a heater) */
  outletTempC: number;
  /** effective source temperature, °C, when known (boiling pot, bath probe) */
  sourceTempC?: number;
  /** which water's volume was measured: 'outlet' (bucket, default) or 'inlet' */
  volumeMeasuredAt?: 'outlet' | 'inlet';
  /** overrides the IF97 density, kg/m³ */
  densityKgPerM3?: number;
  /** overrides the IF97 cp, J/(kg·K) */
  cpJPerKgK?: number;
}

/** Derived quantities of one trial. */
export interface TrialDerivation {
  massFlowKgPerS: number;
  densityKgPerM3: number;
  cpJPerKgK: number;
  deltaTK: number;
  heatW: number;
  /** (Tout − Tin)/(Ts − Tin); null without a source temperature */
  effectiveness: number | null;
  /** −ṁ·cp·ln[(Ts − Tout)/(Ts − Tin)], W/K; null without a source temperature or at zero flow */
  uaWPerK: number | null;
  cautions: Caution[];
}

/**
 * Derives mass flow, ΔT, heat rate, effectiveness and UA for one trial.
 * @throws TypeError for non-finite values; RangeError for a negative flow, an outlet below the
 *   inlet ("inconsistent: outlet below inlet for a heater"), a source not above the outlet, or
 *   temperatures outside the liquid range of the water formulation.
 * @example deriveTrial({ flowM3PerS: 2.5e-4, inletTempC: 17.5, outletTempC: 45 }).heatW // ≈ 28,450 W (a 20 L bucket in 80 s, as in the demo lab)
 */
export function deriveTrial(t: TrialInput): TrialDerivation {
  const flow = requireNonNegative(t.flowM3PerS, 'flowM3PerS');
  const Tin = requireFinite(t.inletTempC, 'inletTempC');
  const Tout = requireFinite(t.outletTempC, 'outletTempC');
  if (Tout < Tin) {
    throw new RangeError(`outletTempC (${Tout}) is below inletTempC (${Tin}): inconsistent for a heater`);
  }
  const water = trialWaterProperties(Tin, Tout, t.volumeMeasuredAt === 'inlet' ? 'inlet' : 'outlet');
  const rho = t.densityKgPerM3 === undefined ? water.densityKgPerM3 : requirePositive(t.densityKgPerM3, 'densityKgPerM3');
  const cp = t.cpJPerKgK === undefined ? water.cpJPerKgK : requirePositive(t.cpJPerKgK, 'cpJPerKgK');
  const m = rho * flow;
  const dT = Tout - Tin;
  let eps: number | null = null;
  let ua: number | null = null;
  if (t.sourceTempC !== undefined) {
    const Ts = requireFinite(t.sourceTempC, 'sourceTempC');
    if (!(Ts > Tin)) throw new RangeError(`sourceTempC (${Ts}) must be above inletTempC (${Tin})`);
    eps = dT / (Ts - Tin);
    ua = m > 0 && dT > 0 ? trialUaWPerK({ sourceTempC: Ts, inletTempC: Tin, outletTempC: Tout, massFlowKgPerS: m, cpJPerKgK: cp }) : null;
  }
  const cautions = mergeCautions(temperatureCautions(Tout, 'outlet'), flow === 0 ? [deadHeadingCaution('this trial')] : []);
  return { massFlowKgPerS: m, densityKgPerM3: rho, cpJPerKgK: cp, deltaTK: dT, heatW: m * cp * dT, effectiveness: eps, uaWPerK: ua, cautions };
}
