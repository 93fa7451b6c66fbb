/**
 * Steady-state thermal performance of a solar collector in the ISO 9806 / EN 12975 form
 * (DOMAIN.md §4 [13, 14, 16]), with ΔT = Tm − Ta (mean fluid minus ambient temperature, K):
 *     η = η0 − a1·ΔT/G − a2·ΔT²/G,      P = A·(η0·G − a1·ΔT − a2·ΔT²)
 * or, from the EN 12975 power curve per module, P = P0·G/G* − A·(a1·ΔT + a2·ΔT²) with
 * P0 = η0·A·G* the power at ΔT = 0 and G* = 1000 W/m². The area basis (gross, aperture or
 * absorber) of A, η0, a1 and a2 must be the same and is carried with the parameters. Below
 * ambient (ΔT < 0) the second-order term is taken as a2·ΔT·|ΔT| (our choice: the fitted form
 * holds for Tm ≥ Ta, and this keeps the power monotone in ΔT); above ambient it is the standard's.
 * `solarCollectorHeater` wraps a collector as a HeaterModel so a solar loop can drive the
 * recirculating forecast: the outlet follows from the collector power at the flow.
 */
import { requireFinite, requireNonNegative, requirePositive } from '../units/guards';
import { fastCpJPerKgK, fastDensityKgPerM3 } from '../water/property-table';
import { temperatureCautions, type Caution } from '../safety/cautions';
import type { HeaterModel } from './heater-model';

/** Reference irradiance G* of the power curve, W/m². */
export const REFERENCE_IRRADIANCE_W_PER_M2 = 1000;

/** Collector coefficients, on one stated area basis. Give `eta0` or `peakPowerW`. */
export interface CollectorParameters {
  /** area the coefficients refer to, m² */
  areaM2: number;
  /** which area that is (DOMAIN.md §4: it must be stated); default 'gross' */
  areaBasis?: 'gross' | 'aperture' | 'absorber';
  /** zero-loss efficiency η0, 0–1 */
  eta0?: number;
  /** P0, W: power at ΔT = 0 and G* = 1000 W/m² (EN 12975 power curve); η0 = P0/(A·G*) */
  peakPowerW?: number;
  /** first-order loss coefficient a1, W/(m²·K) */
  a1WPerM2K: number;
  /** second-order loss coefficient a2, W/(m²·K²) (0 for the first-order form) */
  a2WPerM2K2: number;
}

/**
 * The squared excess of the second-order loss term, ΔT² above ambient and −ΔT² below it
 * (ΔT·|ΔT|, see the module note): the one definition the curve and its fit share.
 * @param deltaTK Tm − Ta, K
 * @returns K²
 * @example secondOrderExcessK2(-2) // -4
 */
export function secondOrderExcessK2(deltaTK: number): number {
  return deltaTK * Math.abs(deltaTK);
}

/** Validated coefficients. */
interface Coefficients { A: number; eta0: number; a1: number; a2: number }

function coefficients(p: CollectorParameters): Coefficients {
  if (p == null || typeof p !== 'object') throw new TypeError('collector parameters must be an object');
  const A = requirePositive(p.areaM2, 'areaM2');
  if ((p.eta0 === undefined) === (p.peakPowerW === undefined)) throw new RangeError('give exactly one of eta0 and peakPowerW');
  const eta0 = p.eta0 !== undefined
    ? requirePositive(p.eta0, 'eta0')
    : requirePositive(p.peakPowerW, 'peakPowerW') / (A * REFERENCE_IRRADIANCE_W_PER_M2);
  if (eta0 > 1) throw new RangeError(`eta0 must be at most 1, got ${eta0} (check peakPowerW against areaM2)`);
  return { A, eta0, a1: requireNonNegative(p.a1WPerM2K, 'a1WPerM2K'), a2: requireNonNegative(p.a2WPerM2K2, 'a2WPerM2K2') };
}

/**
 * Useful power of the collector, W (negative when losses exceed the absorbed sun).
 * @param p collector coefficients
 * @param deltaTK Tm − Ta, K
 * @param irradianceWPerM2 G in the collector plane, W/m² (default G* = 1000)
 * @throws TypeError / RangeError naming the field.
 * @example collectorPowerW({ areaM2: 2, eta0: 0.75, a1WPerM2K: 3.5, a2WPerM2K2: 0.015 }, 20) // 1348
 */
export function collectorPowerW(p: CollectorParameters, deltaTK: number, irradianceWPerM2 = REFERENCE_IRRADIANCE_W_PER_M2): number {
  const c = coefficients(p);
  const dT = requireFinite(deltaTK, 'deltaTK');
  const G = requireNonNegative(irradianceWPerM2, 'irradianceWPerM2');
  return usefulPowerW(c, G, dT);
}

/**
 * Instantaneous efficiency η = η0 − a1·ΔT/G − a2·ΔT²/G, on the area basis of the parameters.
 * @param deltaTK Tm − Ta, K
 * @param irradianceWPerM2 G, W/m², > 0
 * @throws RangeError when G ≤ 0 (efficiency is undefined without sun).
 * @example collectorEfficiency({ areaM2: 2, eta0: 0.75, a1WPerM2K: 3.5, a2WPerM2K2: 0.015 }, 20, 800) // 0.655
 */
export function collectorEfficiency(p: CollectorParameters, deltaTK: number, irradianceWPerM2: number): number {
  const G = requirePositive(irradianceWPerM2, 'irradianceWPerM2');
  return collectorPowerW(p, deltaTK, G) / (coefficients(p).A * G);
}

/**
 * Mean-fluid excess x = Tm − Ta solving the steady balance of a collector fed at Tin:
 * 2C·(x − d) = A·(η0·G − a1·x − a2·x·|x|), C = ṁ·cp, d = Tin − Ta, which has one real root
 * (x·|x| below ambient). C = 0 gives the stagnation excess. Stable quadratic root.
 */
function meanExcessK(c: Coefficients, G: number, d: number, C: number): number {
  const a = c.A * c.a2, b = c.A * c.a1 + 2 * C, rhs = c.A * c.eta0 * G + 2 * C * d;
  if (rhs === 0) return 0;
  const m = Math.abs(rhs);
  const x = (2 * m) / (b + Math.sqrt(b * b + 4 * a * m));
  return Math.sign(rhs) * x;
}

/** Useful power of validated coefficients at a mean excess x = Tm − Ta, W. */
function usefulPowerW(c: Coefficients, G: number, x: number): number {
  return c.A * (c.eta0 * G - c.a1 * x - c.a2 * secondOrderExcessK2(x));
}

/** Operating conditions of a collector loop, SI. */
export interface CollectorConditions {
  inletTempC: number;
  ambientTempC: number;
  /** G in the collector plane, W/m² */
  irradianceWPerM2: number;
  /** water mass flow through the collector, kg/s, > 0 */
  massFlowKgPerS: number;
  /** J/(kg·K); default IF97 cp at the inlet temperature */
  cpJPerKgK?: number;
}

/** Steady outlet of a collector. */
export interface CollectorOutlet {
  outletTempC: number;
  /** Tm − Ta, K */
  deltaTK: number;
  heatW: number;
  /** η at G (null without sun) */
  efficiency: number | null;
  /** Ta + the stagnation excess: what the water approaches with no flow, °C */
  stagnationTempC: number;
  cautions: Caution[];
}

/**
 * Steady outlet temperature and power of a collector for an inlet temperature and flow.
 * @throws TypeError / RangeError naming the field; RangeError when the flow is ≤ 0 (use the
 *   stagnation temperature: a collector with no flow in the sun is a boiler, DOMAIN.md §5).
 * @example collectorOutlet(p, { inletTempC: 25, ambientTempC: 20, irradianceWPerM2: 900, massFlowKgPerS: 0.03 }).outletTempC
 */
export function collectorOutlet(p: CollectorParameters, s: CollectorConditions): CollectorOutlet {
  const c = coefficients(p);
  const Tin = requireFinite(s.inletTempC, 'inletTempC');
  const Ta = requireFinite(s.ambientTempC, 'ambientTempC');
  const G = requireNonNegative(s.irradianceWPerM2, 'irradianceWPerM2');
  const m = requirePositive(s.massFlowKgPerS, 'massFlowKgPerS');
  const cp = s.cpJPerKgK === undefined ? fastCpJPerKgK(Tin) : requirePositive(s.cpJPerKgK, 'cpJPerKgK');
  const x = meanExcessK(c, G, Tin - Ta, m * cp);
  const outletTempC = 2 * (Ta + x) - Tin;
  return {
    // the heat is the collector power at the balance point (= ṁ·cp·(Tout − Tin) without its cancellation)
    outletTempC, deltaTK: x, heatW: usefulPowerW(c, G, x),
    efficiency: G > 0 ? c.eta0 - (c.a1 * x + c.a2 * secondOrderExcessK2(x)) / G : null,
    stagnationTempC: Ta + meanExcessK(c, G, 0, 0),
    cautions: temperatureCautions(outletTempC, 'outlet'),
  };
}

/** A collector array feeding the recirculating forecast under constant weather. */
export interface SolarCollectorHeaterOptions {
  collector: CollectorParameters;
  /** identical modules in parallel sharing the flow equally (default 1) */
  modules?: number;
  irradianceWPerM2: number;
  ambientTempC: number;
  /** fixed cp, J/(kg·K); default IF97 cp at the inlet temperature */
  cpJPerKgK?: number;
  /** fixed density, kg/m³; default IF97 density at the inlet temperature */
  densityKgPerM3?: number;
}

/**
 * The collector as a HeaterModel: ṁ = ρ(Tin)·V̇/modules per module, outlet from the steady
 * balance of `collectorOutlet`. Its `sourceTempC` is the stagnation temperature (what the loop
 * reaches with no flow), so a forecast warns when that is above boiling. Weather is constant:
 * run the heater in daylight hours only (`heaterHours`) or build one per period.
 * @throws TypeError / RangeError naming the field.
 * @example recirculatingForecast({ ..., heater: solarCollectorHeater({ collector: p, modules: 8, irradianceWPerM2: 800, ambientTempC: 25 }) })
 */
export function solarCollectorHeater(o: SolarCollectorHeaterOptions): HeaterModel {
  const c = coefficients(o.collector);
  const n = o.modules === undefined ? 1 : requirePositive(o.modules, 'modules');
  if (!Number.isInteger(n)) throw new RangeError(`modules must be a whole number, got ${n}`);
  const G = requireNonNegative(o.irradianceWPerM2, 'irradianceWPerM2');
  const Ta = requireFinite(o.ambientTempC, 'ambientTempC');
  const cpFixed = o.cpJPerKgK === undefined ? 0 : requirePositive(o.cpJPerKgK, 'cpJPerKgK');
  const rhoFixed = o.densityKgPerM3 === undefined ? 0 : requirePositive(o.densityKgPerM3, 'densityKgPerM3');
  const stagnation = Ta + meanExcessK(c, G, 0, 0);
  return {
    name: 'solar-collector',
    inletTransferable: true,
    fittedInletC: null,
    sourceTempC: stagnation,
    outletTempC(flowM3PerS: number, inletTempC: number): number {
      if (!(flowM3PerS > 0)) return stagnation;
      const C = ((rhoFixed || fastDensityKgPerM3(inletTempC)) * flowM3PerS * (cpFixed || fastCpJPerKgK(inletTempC))) / n;
      return 2 * (Ta + meanExcessK(c, G, inletTempC - Ta, C)) - inletTempC;
    },
    heatW(flowM3PerS: number, inletTempC: number): number {
      if (!(flowM3PerS > 0)) return 0;
      const C = ((rhoFixed || fastDensityKgPerM3(inletTempC)) * flowM3PerS * (cpFixed || fastCpJPerKgK(inletTempC))) / n;
      return n * usefulPowerW(c, G, meanExcessK(c, G, inletTempC - Ta, C));
    },
  };
}
