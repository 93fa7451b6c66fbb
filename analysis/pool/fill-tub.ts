/**
 * Fill mode: a heater filling a tub in a single pass from a supply (mains or a tank). Fill time
 * V/V̇; the tub ends at the mass-and-enthalpy mix (mixing.ts) of the outlet water and any water
 * already in it.
 * Surface losses during the fill are ignored (fills take minutes to hours).
 */
import { requireFinite, requireNonNegative, requirePositive } from '../units/guards';
import type { HeaterModel } from '../performance/heater-model';
import { deadHeadingCaution, mergeCautions, temperatureCautions, type Caution } from '../safety/cautions';
import { mixTemperatureC } from './mixing';

/** Result of a fill. */
export interface FillResult {
  fillTimeS: number;
  outletTempC: number;
  finalTempC: number;
  cautions: Caution[];
}

/**
 * @param o.tubVolumeM3 water to add, m³
 * @param o.flowM3PerS fill flow, m³/s (0 raises the dead-heading caution and a RangeError)
 * @param o.supplyTempC supply water temperature (the heater inlet), °C
 * @param o.initialVolumeM3 water already in the tub, m³ (default 0), at `initialTempC`
 * @throws RangeError for zero flow (with the dead-heading message), negative volumes.
 * @example fillTub({ heater: coilHeater({ sourceTempC: 88, uaWPerK: 430 }), tubVolumeM3: 1.5, flowM3PerS: 1.5e-4, supplyTempC: 15 }).finalTempC // ≈ 51.2
 */
export function fillTub(o: {
  heater: HeaterModel; tubVolumeM3: number; flowM3PerS: number; supplyTempC: number; initialVolumeM3?: number; initialTempC?: number;
}): FillResult {
  const V = requirePositive(o.tubVolumeM3, 'tubVolumeM3');
  const q = requireNonNegative(o.flowM3PerS, 'flowM3PerS');
  const Tin = requireFinite(o.supplyTempC, 'supplyTempC');
  if (q === 0) throw new RangeError(`flowM3PerS is 0: ${deadHeadingCaution('the fill').message}`);
  const V0 = requireNonNegative(o.initialVolumeM3 ?? 0, 'initialVolumeM3');
  const T0 = V0 > 0 ? requireFinite(o.initialTempC, 'initialTempC') : 0;
  const Tout = o.heater.outletTempC(q, Tin);
  const T = mixTemperatureC([{ volumeM3: V, tempC: Tout, field: 'outlet water' }, { volumeM3: V0, tempC: T0, field: 'initial water' }]);
  return {
    fillTimeS: V / q, outletTempC: Tout, finalTempC: T,
    cautions: mergeCautions(temperatureCautions(Tout, 'outlet'), temperatureCautions(T, 'tub')),
  };
}
