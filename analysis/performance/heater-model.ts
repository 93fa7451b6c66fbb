/**
 * The small heater interface the pool models drive: an outlet temperature for a volume flow and
 * an inlet temperature. Implementations: the physical coil (ε-NTU, carries over to any inlet),
 * a fixed temperature rise (what a single bucket test suggests), and fitted models
 * (fitted-heater.ts, from the fitting engine).
 */
import { requireFinite, requirePositive } from '../units/guards';
import { fastCpJPerKgK, fastDensityKgPerM3 } from '../water/property-table';
import { requireSourceTempC } from './coil-ntu';

/** A heater as seen by the pool models. */
export interface HeaterModel {
  /** a short label, e.g. 'coil' */
  readonly name: string;
  /**
   * Outlet temperature, °C, for a volume flow (m³/s, > 0) and inlet temperature (°C). Must be
   * cheap and allocation-free: the forecast calls it every step.
   */
  outletTempC(flowM3PerS: number, inletTempC: number): number;
  /**
   * Heat delivered to the water, W, for the same flow and inlet, computed without taking the
   * small difference Tout − Tin of two nearly equal numbers (for the coil
   * −expm1(−NTU)·ṁ·cp·(Ts − Tin), which tends to UA·(Ts − Tin) as the flow grows, DOMAIN.md §1.2).
   * Same cost rules as `outletTempC`.
   */
  heatW(flowM3PerS: number, inletTempC: number): number;
  /** true when the model holds at any inlet temperature (physics), false for empirical fits */
  readonly inletTransferable: boolean;
  /** the inlet temperature an empirical model was fitted at, °C (null when transferable) */
  readonly fittedInletC: number | null;
  /** the effective source temperature, °C, when the model has one (for boiling cautions) */
  readonly sourceTempC: number | null;
}

/** Parameters of the physical coil. */
export interface CoilHeaterOptions {
  /** effective source temperature Ts, °C */
  sourceTempC: number;
  /** conductance UA, W/K */
  uaWPerK: number;
  /** fixed cp, J/(kg·K); default IF97 cp at the inlet temperature */
  cpJPerKgK?: number;
  /** fixed density, kg/m³; default IF97 density at the inlet temperature */
  densityKgPerM3?: number;
}

/**
 * The ε-NTU coil as a HeaterModel: ṁ = ρ(Tin)·V̇, Tout = Ts − (Ts − Tin)·exp(−UA/(ṁ·cp)),
 * q = −expm1(−NTU)·ṁ·cp·(Ts − Tin).
 * @throws TypeError for non-finite Ts or UA; RangeError for UA ≤ 0 or Ts outside 0…{@link MAX_SOURCE_TEMP_C} °C.
 * @example coilHeater({ sourceTempC: 88, uaWPerK: 430 }).heatW(1.5e-4, 20) // ≈ 21.2 kW (the demo lab's Stovepipe Coil A at 9 L/min)
 */
export function coilHeater(o: CoilHeaterOptions): HeaterModel {
  const Ts = requireSourceTempC(o.sourceTempC);
  const ua = requirePositive(o.uaWPerK, 'uaWPerK');
  const cpFixed = o.cpJPerKgK === undefined ? 0 : requirePositive(o.cpJPerKgK, 'cpJPerKgK');
  const rhoFixed = o.densityKgPerM3 === undefined ? 0 : requirePositive(o.densityKgPerM3, 'densityKgPerM3');
  return {
    name: 'coil',
    inletTransferable: true,
    fittedInletC: null,
    sourceTempC: Ts,
    outletTempC(flowM3PerS: number, inletTempC: number): number {
      if (!(flowM3PerS > 0)) return Ts; // no flow: the coil water heads for the source temperature
      const rho = rhoFixed || fastDensityKgPerM3(inletTempC);
      const cp = cpFixed || fastCpJPerKgK(inletTempC);
      return Ts - (Ts - inletTempC) * Math.exp(-ua / (rho * flowM3PerS * cp));
    },
    heatW(flowM3PerS: number, inletTempC: number): number {
      if (!(flowM3PerS > 0)) return 0;
      const C = (rhoFixed || fastDensityKgPerM3(inletTempC)) * flowM3PerS * (cpFixed || fastCpJPerKgK(inletTempC));
      return -Math.expm1(-ua / C) * C * (Ts - inletTempC);
    },
  };
}

/**
 * A heater that adds a fixed rise whatever the flow and inlet (the naive reading of one bucket
 * test). Offered for comparison: it over-predicts a warming pool (DOMAIN.md §3.3). Heat
 * q = ρ(Tin)·V̇·cp(Tin)·rise.
 * @param riseK 0…100 K: a heater does not cool the water, and liquid water at 1 atm spans 100 K
 * @throws TypeError when not finite; RangeError for a rise below 0 (it would cool the water) or above 100 K.
 * @example fixedRiseHeater(10).outletTempC(1e-4, 20) // 30
 */
export function fixedRiseHeater(riseK: number): HeaterModel {
  const r = requireFinite(riseK, 'riseK');
  if (r < 0) throw new RangeError(`riseK must be 0 or more: a rise of ${r} K would cool the water, which is not a heater`);
  if (r > 100) throw new RangeError(`riseK must be at most 100 K (liquid water at 1 atm), got ${r}`);
  return {
    name: 'fixed-rise', inletTransferable: false, fittedInletC: null, sourceTempC: null,
    outletTempC: (_f: number, tin: number) => tin + r,
    heatW: (f: number, tin: number) => (f > 0 ? fastDensityKgPerM3(tin) * f * fastCpJPerKgK(tin) * r : 0),
  };
}
