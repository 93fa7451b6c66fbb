/**
 * Liquid-water properties for the heater and pool models, from IAPWS-IF97 region 1
 * (see if97-region1.ts). Default pressure one standard atmosphere (101,325 Pa).
 *
 * Validity policy: liquid only. At 1 atm the accepted range is 0 °C to 100 °C (the IF97 region-1
 * liquid, allowing the 0.026 K of metastable liquid between the 99.974 °C boiling point and
 * 100 °C); at a higher pressure (a closed coil) up to that pressure's boiling point, at most
 * 350 °C. Outside it the functions throw instead of extrapolating.
 */
import { requireFinite } from '../units/guards';
import { if97Region1, type Region1State } from './if97-region1';
import { saturationTempC } from './saturation-pressure';

/** One standard atmosphere, Pa (NIST SP 811, exact). */
export const STANDARD_ATMOSPHERE_PA = 101_325;

function checkedState(tempC: number, pressurePa: number, field: string): Region1State {
  requireFinite(tempC, field);
  requireFinite(pressurePa, 'pressurePa');
  if (pressurePa < 1000 || pressurePa > 100e6) {
    throw new RangeError(`pressurePa must be between 1 kPa and 100 MPa, got ${pressurePa}`);
  }
  const maxC = Math.min(350, Math.max(100, pressurePa <= 22.064e6 ? saturationTempC(pressurePa) : 350));
  if (tempC < 0 || tempC > maxC) {
    throw new RangeError(
      `${field} must be between 0 and ${Number(maxC.toFixed(3))} °C for liquid water at ${pressurePa} Pa, got ${tempC}`,
    );
  }
  return if97Region1(tempC + 273.15, pressurePa);
}

/**
 * Density of liquid water.
 * @param tempC °C, 0–100 at 1 atm (see validity policy)
 * @param pressurePa absolute pressure, Pa (default 101,325)
 * @returns kg/m³
 * @throws TypeError when not finite; RangeError outside the liquid range.
 * @example waterDensityKgPerM3(35) // 994.03
 */
export function waterDensityKgPerM3(tempC: number, pressurePa = STANDARD_ATMOSPHERE_PA, field = 'tempC'): number {
  return checkedState(tempC, pressurePa, field).densityKgPerM3;
}

/**
 * Isobaric specific heat capacity of liquid water.
 * @returns J/(kg·K)
 * @throws as `waterDensityKgPerM3`.
 * @example waterCpJPerKgK(25) // 4181.6
 */
export function waterCpJPerKgK(tempC: number, pressurePa = STANDARD_ATMOSPHERE_PA, field = 'tempC'): number {
  return checkedState(tempC, pressurePa, field).cpJPerKgK;
}

/**
 * Specific enthalpy of liquid water (zero near the triple-point liquid, as IAPWS-95).
 * @returns J/kg
 * @throws as `waterDensityKgPerM3`.
 * @example waterEnthalpyJPerKg(20) // ≈ 83.9e3
 */
export function waterEnthalpyJPerKg(tempC: number, pressurePa = STANDARD_ATMOSPHERE_PA, field = 'tempC'): number {
  return checkedState(tempC, pressurePa, field).enthalpyJPerKg;
}

/**
 * All region-1 properties at once (density, enthalpy, cp, entropy, speed of sound).
 * @throws as `waterDensityKgPerM3`.
 * @example waterProperties(60).densityKgPerM3 // 983.2
 */
export function waterProperties(tempC: number, pressurePa = STANDARD_ATMOSPHERE_PA, field = 'tempC'): Region1State {
  return checkedState(tempC, pressurePa, field);
}

/**
 * The temperature of liquid water with a given specific enthalpy: the inverse of
 * `waterEnthalpyJPerKg` (IF97 region 1), by Newton's method with dh/dT = cp, safeguarded by
 * bisection on the liquid range. Converges to a few 1e-12 K in three or four steps.
 * @param enthalpyJPerKg J/kg (zero near the triple-point liquid)
 * @param pressurePa absolute pressure, Pa (default 101,325)
 * @returns °C
 * @throws TypeError when not finite; RangeError when the enthalpy is outside the liquid range at that pressure.
 * @example waterTempAtEnthalpyC(waterEnthalpyJPerKg(35)) // 35
 */
export function waterTempAtEnthalpyC(enthalpyJPerKg: number, pressurePa = STANDARD_ATMOSPHERE_PA, field = 'enthalpyJPerKg'): number {
  const h = requireFinite(enthalpyJPerKg, field);
  const maxC = Math.min(350, Math.max(100, pressurePa <= 22.064e6 ? saturationTempC(pressurePa) : 350));
  let lo = 0, hi = maxC;
  const hLo = checkedState(lo, pressurePa, 'tempC').enthalpyJPerKg, hHi = checkedState(hi, pressurePa, 'tempC').enthalpyJPerKg;
  if (h < hLo || h > hHi) {
    throw new RangeError(`${field} must be between ${hLo.toFixed(0)} and ${hHi.toFixed(0)} J/kg for liquid water at ${pressurePa} Pa, got ${h}`);
  }
  let t = (h - hLo) / (hHi - hLo) * maxC;
  for (let i = 0; i < 60; i++) {
    const s = if97Region1(t + 273.15, pressurePa);
    const f = s.enthalpyJPerKg - h;
    if (f > 0) hi = t; else lo = t;
    let next = t - f / s.cpJPerKgK;
    if (!(next > lo && next < hi)) next = (lo + hi) / 2;
    if (Math.abs(next - t) < 1e-13 * Math.max(1, Math.abs(t))) return next;
    t = next;
  }
  return t;
}
