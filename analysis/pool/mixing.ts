/**
 * Mixing of volumes (DOMAIN.md §3.3): T_mix = Σ V_i T_i / Σ V_i (same fluid, no losses, density
 * change neglected), and the single-pass "session" view of heating: the volume that passed the
 * heater in a session, at its outlet temperature, mixed into the rest of the pool.
 */
import { requireFinite, requireNonNegative, requirePositive } from '../units/guards';
import type { HeaterModel } from '../performance/heater-model';
import { mergeCautions, temperatureCautions, type Caution } from '../safety/cautions';
import { waterDensityKgPerM3 } from '../water/water-properties';
import { fastCpJPerKgK, fastDensityKgPerM3 } from '../water/property-table';

/** One volume of water at one temperature. */
export interface MixPart {
  volumeM3: number;
  tempC: number;
}

/**
 * Volume-weighted mixed temperature.
 * @throws TypeError / RangeError naming the part for a negative volume, or when the total is 0.
 * @example mixTemperatureC([{ volumeM3: 0.1, tempC: 60 }, { volumeM3: 1, tempC: 20 }]) // 23.636
 */
export function mixTemperatureC(parts: MixPart[]): number {
  if (!Array.isArray(parts) || parts.length === 0) throw new RangeError('parts must list at least one volume');
  let v = 0, vt = 0;
  parts.forEach((p, i) => {
    const vi = requireNonNegative(p?.volumeM3, `parts[${i}].volumeM3`);
    const ti = requireFinite(p?.tempC, `parts[${i}].tempC`);
    v += vi;
    vt += vi * ti;
  });
  if (!(v > 0)) throw new RangeError('the total volume of the parts must be greater than 0');
  return vt / v;
}

/** Result of a mixing session. */
export interface MixingSession {
  heatedVolumeM3: number;
  finalTempC: number;
  riseK: number;
  risePerHourK: number;
  cautions: Caution[];
}

/**
 * A session of `hours` at a volume flow whose water leaves the heater at `outletTempC` and mixes
 * into the pool: heated volume V_h = V̇·t; T = (V_h·T_out + (V − V_h)·T_pool)/V.
 * This single-pass view is what the trade quotes; it ignores that the heater's inlet warms during
 * the session — use the recirculating forecast for that.
 * @param poolVolumeM3 the whole pool, m³
 * @throws RangeError when V_h exceeds the pool volume (use the recirculating forecast) or for
 *   non-positive inputs.
 * @example mixingSession({ poolVolumeM3: 45.42, poolTempC: 22.78, flowM3PerS: 1.577e-4, hours: 6, outletTempC: 46.67 }).risePerHourK
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
  const T = mixTemperatureC([{ volumeM3: Vh, tempC: Tout }, { volumeM3: V - Vh, tempC: Tp }]);
  return {
    heatedVolumeM3: Vh, finalTempC: T, riseK: T - Tp, risePerHourK: (T - Tp) / h,
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
