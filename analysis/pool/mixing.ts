/**
 * Mixing of water (DOMAIN.md §3.3) by mass and enthalpy: each part's mass is ρ(Tᵢ)·Vᵢ and the
 * mixture's temperature T solves Σ mᵢ·h(Tᵢ) = (Σ mᵢ)·h(T), with the IAPWS-IF97 density and
 * enthalpy of liquid water at 1 atm (analysis/water). The trade's volume-weighted rule
 * T = Σ Vᵢ·Tᵢ / Σ Vᵢ ignores that hot water is lighter (and that cp changes): it is kept, labelled,
 * for comparison only; for very different temperatures it is up to about 1 K off. Also the
 * single-pass "session" view of heating: the volume that passed the heater in a session, at its
 * outlet temperature, mixed into the rest of the pool.
 */
import { requireFinite, requireNonNegative, requirePositive } from '../units/guards';
import type { HeaterModel } from '../performance/heater-model';
import { mergeCautions, temperatureCautions, type Caution } from '../safety/cautions';
import { waterDensityKgPerM3, waterEnthalpyJPerKg, waterTempAtEnthalpyC } from '../water/water-properties';
import { fastCpJPerKgK, fastDensityKgPerM3 } from '../water/property-table';

/** One volume of water at one temperature (the volume as measured at that temperature). */
export interface MixPart {
  volumeM3: number;
  tempC: number;
  /** how errors name this part (default `parts[i]`) */
  field?: string;
}

/** One mass of water at one temperature. */
export interface MassPart {
  massKg: number;
  tempC: number;
  /** how errors name this part (default `parts[i]`) */
  field?: string;
}

const partName = (p: { field?: string } | undefined, i: number) => (typeof p?.field === 'string' ? p.field : `parts[${i}]`);

/**
 * Mixed temperature of masses of liquid water at 1 atm, by enthalpy.
 * @returns °C
 * @throws TypeError / RangeError naming the part for a negative mass, a temperature outside
 *   liquid water at 1 atm (0–100 °C), or a total mass of 0.
 * @example mixMassesTempC([{ massKg: 100, tempC: 40 }, { massKg: 300, tempC: 20 }]) // ≈ 24.997 (volume-weighted 25)
 */
export function mixMassesTempC(parts: MassPart[]): number {
  const h = weightedMean(parts, 'mass of water', (p, name) => requireNonNegative(p?.massKg, `${name}.massKg`),
    (p, name) => waterEnthalpyJPerKg(requireFinite(p?.tempC, `${name}.tempC`), undefined, `${name}.tempC`));
  return waterTempAtEnthalpyC(h);
}

/** Σ wᵢ·vᵢ / Σ wᵢ over the parts, each weight and value read (and checked) by the callbacks. */
function weightedMean<P extends { field?: string }>(parts: P[], what: string, weight: (p: P, name: string) => number, value: (p: P, name: string) => number): number {
  if (!Array.isArray(parts) || parts.length === 0) throw new RangeError(`parts must list at least one ${what}`);
  let w = 0, wv = 0;
  parts.forEach((p, i) => {
    const name = partName(p, i);
    const wi = weight(p, name);
    w += wi;
    wv += wi * value(p, name);
  });
  if (!(w > 0)) throw new RangeError(`the total ${what.replace(/ of water$/, '')} of the parts must be greater than 0`);
  return wv / w;
}

/**
 * Mixed temperature of volumes of liquid water at 1 atm: masses ρ(Tᵢ)·Vᵢ, then by enthalpy.
 * @returns °C
 * @throws TypeError / RangeError naming the part for a negative volume, a temperature outside
 *   liquid water at 1 atm (0–100 °C), or a total volume of 0.
 * @example mixTemperatureC([{ volumeM3: 1, tempC: 40 }, { volumeM3: 3, tempC: 20 }]) // ≈ 24.97 (volume-weighted 25)
 */
export function mixTemperatureC(parts: MixPart[]): number {
  if (!Array.isArray(parts) || parts.length === 0) throw new RangeError('parts must list at least one volume');
  let v = 0;
  const masses = parts.map((p, i): MassPart => {
    const name = partName(p, i);
    const vi = requireNonNegative(p?.volumeM3, `${name}.volumeM3`);
    const ti = requireFinite(p?.tempC, `${name}.tempC`);
    v += vi;
    return { massKg: vi * waterDensityKgPerM3(ti, undefined, `${name}.tempC`), tempC: ti, field: name };
  });
  if (!(v > 0)) throw new RangeError('the total volume of the parts must be greater than 0');
  return mixMassesTempC(masses);
}

/**
 * The trade's rule of thumb, for comparison only: T = Σ Vᵢ·Tᵢ / Σ Vᵢ (density and cp changes
 * neglected, DOMAIN.md §3.3). Use {@link mixTemperatureC} for the mixed temperature.
 * @throws TypeError / RangeError naming the part for a negative volume, or when the total is 0.
 * @example volumeWeightedTempC([{ volumeM3: 1, tempC: 40 }, { volumeM3: 3, tempC: 20 }]) // 25
 */
export function volumeWeightedTempC(parts: MixPart[]): number {
  return weightedMean(parts, 'volume', (p, name) => requireNonNegative(p?.volumeM3, `${name}.volumeM3`), (p, name) => requireFinite(p?.tempC, `${name}.tempC`));
}

/** Result of a mixing session. */
export interface MixingSession {
  heatedVolumeM3: number;
  /** by mass and enthalpy, °C */
  finalTempC: number;
  riseK: number;
  risePerHourK: number;
  /** the trade's volume-weighted figure, for comparison only, °C */
  volumeWeightedTempC: number;
  cautions: Caution[];
}

/**
 * A session of `hours` at a volume flow whose water leaves the heater at `outletTempC` and mixes
 * into the pool: the heated volume V_h = V̇·t is drawn from the pool (mass ρ(T_pool)·V_h), comes
 * back at the outlet temperature and mixes by enthalpy with the rest, ρ(T_pool)·(V − V_h).
 * This single-pass view is what the trade quotes; it ignores that the heater's inlet warms during
 * the session — use the recirculating forecast for that.
 * @param poolVolumeM3 the whole pool, m³
 * @throws RangeError when V_h exceeds the pool volume (use the recirculating forecast), for
 *   non-positive inputs, or temperatures outside liquid water at 1 atm.
 * @example mixingSession({ poolVolumeM3: 40, poolTempC: 22, flowM3PerS: 1.5e-4, hours: 6, outletTempC: 45 }).risePerHourK // ≈ 0.31 K/h
 */
export function mixingSession(o: { poolVolumeM3: number; poolTempC: number; flowM3PerS: number; hours: number; outletTempC: number }): MixingSession {
  const V = requirePositive(o.poolVolumeM3, 'poolVolumeM3');
  const Tp = requireFinite(o.poolTempC, 'poolTempC');
  const q = requireNonNegative(o.flowM3PerS, 'flowM3PerS');
  const h = requirePositive(o.hours, 'hours');
  const Tout = requireFinite(o.outletTempC, 'outletTempC');
  const Vh = q * h * 3600;
  if (Vh > V) {
    throw new RangeError(`the heated volume (${Vh.toFixed(3)} m³) exceeds poolVolumeM3 (${V}); use the recirculating forecast`);
  }
  const rho = waterDensityKgPerM3(Tp, undefined, 'poolTempC');
  waterDensityKgPerM3(Tout, undefined, 'outletTempC'); // liquid at 1 atm, or the message names the outlet
  const T = mixMassesTempC([{ massKg: rho * Vh, tempC: Tout }, { massKg: rho * (V - Vh), tempC: Tp }]);
  return {
    heatedVolumeM3: Vh, finalTempC: T, riseK: T - Tp, risePerHourK: (T - Tp) / h,
    volumeWeightedTempC: volumeWeightedTempC([{ volumeM3: Vh, tempC: Tout }, { volumeM3: V - Vh, tempC: Tp }]),
    cautions: mergeCautions(temperatureCautions(Tout, 'outlet'), temperatureCautions(T, 'pool')),
  };
}

/**
 * Rise per hour by flow × pool size for a heater model at the pool temperature (the heater's
 * inlet): rise/h = q(V̇, T_pool)·3600/(ρ(T_pool)·V·cp(T_pool)), with the heater's heat q computed
 * without cancellation (so at high flow it tends to the coil's ceiling UA·(Ts − T_pool)).
 * @returns rows[i][j] for flowsM3PerS[i] and poolVolumesM3[j], K/h
 * @throws RangeError for empty or non-positive lists, or a pool temperature outside liquid water.
 * @example risePerHourTable(fixedRiseHeater(10), [1e-4, 2e-4], [20, 50], 20)[0][0] // 0.18 K/h
 */
export function risePerHourTable(heater: HeaterModel, flowsM3PerS: number[], poolVolumesM3: number[], poolTempC: number): number[][] {
  if (!flowsM3PerS.length || !poolVolumesM3.length) throw new RangeError('flowsM3PerS and poolVolumesM3 must not be empty');
  const Tp = requireFinite(poolTempC, 'poolTempC');
  waterDensityKgPerM3(Tp, undefined, 'poolTempC'); // the range check
  const heatCapacityPerM3 = fastDensityKgPerM3(Tp) * fastCpJPerKgK(Tp); // the same property table as the heater models
  return flowsM3PerS.map((f, i) => {
    const heat = heater.heatW(requirePositive(f, `flowsM3PerS[${i}]`), Tp);
    return poolVolumesM3.map((v, j) => (heat * 3600) / (heatCapacityPerM3 * requirePositive(v, `poolVolumesM3[${j}]`)));
  });
}
