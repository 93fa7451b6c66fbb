/**
 * The small heater interface the pool models drive: an outlet temperature for a volume flow and
 * an inlet temperature. Implementations: the physical coil (ε-NTU, carries over to any inlet),
 * a fixed temperature rise (what a single bucket test suggests), and fitted models
 * (fitted-heater.ts, from the fitting engine).
 */
import { requireFinite, requirePositive } from '../units/guards';
import { fastCpJPerKgK, fastDensityKgPerM3 } from '../water/property-table';

/** A heater as seen by the pool models. */
export interface HeaterModel {
  /** a short label, e.g. 'coil' */
  readonly name: string;
  /**
   * Outlet temperature, °C, for a volume flow (m³/s, > 0) and inlet temperature (°C). Must be
   * cheap and allocation-free: the forecast calls it every step.
   */
  outletTempC(flowM3PerS: number, inletTempC: number): number;
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
 * The ε-NTU coil as a HeaterModel: ṁ = ρ(Tin)·V̇, Tout = Ts − (Ts − Tin)·exp(−UA/(ṁ·cp)).
 * @throws TypeError / RangeError for non-finite Ts or UA ≤ 0.
 * @example coilHeater({ sourceTempC: 90, uaWPerK: 500 }).outletTempC(1e-4, 20) // ≈ 68.8
 */
export function coilHeater(o: CoilHeaterOptions): HeaterModel {
  const Ts = requireFinite(o.sourceTempC, 'sourceTempC');
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
  };
}

/**
 * A heater that adds a fixed rise whatever the flow and inlet (the naive reading of one bucket
 * test). Offered for comparison: it over-predicts a warming pool (DOMAIN.md §3.3).
 * @example fixedRiseHeater(10).outletTempC(1e-4, 20) // 30
 */
export function fixedRiseHeater(riseK: number): HeaterModel {
  const r = requireFinite(riseK, 'riseK');
  return {
    name: 'fixed-rise', inletTransferable: false, fittedInletC: null, sourceTempC: null,
    outletTempC: (_f: number, tin: number) => tin + r,
  };
}
