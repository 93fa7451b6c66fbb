/**
 * Annual energy of a pool heater by the US DOE uniform test method (10 CFR 430 Subpart B,
 * Appendix P; DOMAIN.md §4, §6 [17]): a neutral template for annualising a measured heater.
 *     EF  = BOH·QIN + (POH − BOH)·QP      annual fuel energy
 *     EAE = BOH·PE                        annual auxiliary electric energy
 * with BOH = 104 burner-operating hours and POH = 4,464 pool-operating hours a year; QIN is
 * the fuel input rate, QP the standing-pilot rate (0 without a pilot), PE the auxiliary
 * electric power. Rates in W here (SI); energies in J.
 */
import { requireNonNegative, requirePositive } from '../units/guards';

/** Burner-operating hours a year, h (10 CFR 430 App. P [17]). */
export const DOE_BURNER_OPERATING_HOURS = 104;
/** Pool-operating hours a year, h (10 CFR 430 App. P [17]). */
export const DOE_POOL_OPERATING_HOURS = 4464;

/** Annual energies, J, and the hours used. */
export interface AnnualHeaterEnergy {
  /** EF, J */
  fuelJ: number;
  /** EAE, J */
  electricJ: number;
  /** BOH·QIN·Et, J, when a thermal efficiency is given (our addition, for payback) */
  usefulJ: number | null;
  burnerHours: number;
  poolHours: number;
  /** POH − BOH: the hours the pilot burns alone, h */
  pilotOnlyHours: number;
}

/**
 * @param o.fuelInputW QIN, fuel input rate (HHV), W
 * @param o.pilotW QP, standing-pilot fuel rate, W (default 0)
 * @param o.auxElectricW PE, auxiliary electric power while the burner runs, W (default 0)
 * @param o.thermalEfficiency Et, 0–1, to also give the useful heat
 * @param o.burnerHours / o.poolHours override BOH and POH, h (defaults 104 and 4,464)
 * @throws TypeError / RangeError naming the field; RangeError when poolHours < burnerHours.
 * @example annualHeaterEnergy({ fuelInputW: 73_268, pilotW: 293 }).fuelJ // ≈ 3.203e10 (250,000 Btu/h input, 1,000 Btu/h pilot: 30.36 MMBtu)
 */
export function annualHeaterEnergy(o: {
  fuelInputW: number; pilotW?: number; auxElectricW?: number; thermalEfficiency?: number; burnerHours?: number; poolHours?: number;
}): AnnualHeaterEnergy {
  const qin = requireNonNegative(o.fuelInputW, 'fuelInputW');
  const qp = requireNonNegative(o.pilotW ?? 0, 'pilotW');
  const pe = requireNonNegative(o.auxElectricW ?? 0, 'auxElectricW');
  const boh = requireNonNegative(o.burnerHours ?? DOE_BURNER_OPERATING_HOURS, 'burnerHours');
  const poh = requireNonNegative(o.poolHours ?? DOE_POOL_OPERATING_HOURS, 'poolHours');
  if (poh < boh) throw new RangeError(`poolHours (${poh}) must be at least burnerHours (${boh})`);
  let eta: number | null = null;
  if (o.thermalEfficiency !== undefined) {
    eta = requirePositive(o.thermalEfficiency, 'thermalEfficiency');
    if (eta > 1) throw new RangeError(`thermalEfficiency must be at most 1, got ${eta}`);
  }
  const s = 3600;
  return {
    fuelJ: (boh * qin + (poh - boh) * qp) * s,
    electricJ: boh * pe * s,
    usefulJ: eta === null ? null : boh * qin * eta * s,
    burnerHours: boh, poolHours: poh, pilotOnlyHours: poh - boh,
  };
}
