/**
 * Latent heat (enthalpy) of vaporisation of water along the saturation line.
 *
 * Method: the Clausius–Clapeyron equation, exact for a pure substance,
 *     L = T · (dp/dT)_sat · (1/ρ″ − 1/ρ′),
 * evaluated with the auxiliary equations of the IAPWS "Revised Supplementary Release on
 * Saturation Properties of Ordinary Water Substance" (SR1-86, 1992; Wagner & Pruß, J. Phys. Chem.
 * Ref. Data 22, 783 (1993)): the vapour-pressure equation and its derivative, and the saturated
 * liquid and vapour density equations. Agrees with IAPWS-95 (R6-95 Table 8) to about 1e-4.
 */
import { requireFinite } from '../units/guards';

const TC = 647.096; // K
const PC = 22.064e6; // Pa
const RHOC = 322; // kg/m³
const a = [-7.85951783, 1.84408259, -11.7866497, 22.6807411, -15.9618719, 1.80122502];
const b = [1.99274064, 1.09965342, -0.510839303, -1.75493479, -45.5170352, -6.7469445e5];
const c = [-2.0315024, -2.6830294, -5.38626492, -17.2991605, -44.7586581, -63.9201063];

/** Saturation values from the SR1-86 auxiliary equations at one temperature. */
export interface SaturationState {
  pressurePa: number;
  dPdTPaPerK: number;
  liquidDensityKgPerM3: number;
  vapourDensityKgPerM3: number;
  latentHeatJPerKg: number;
}

/**
 * Saturation state from the IAPWS SR1-86 auxiliary equations.
 * @param tempC temperature, °C, 0.01 to 373.946
 * @throws TypeError when not finite; RangeError outside 0.01–373.946 °C (a 0 °C input is accepted
 *   and treated as the triple point, 0.01 °C, for the purposes of the range check only).
 * @example saturationState(30).latentHeatJPerKg // ≈ 2.430e6
 */
export function saturationState(tempC: number): SaturationState {
  requireFinite(tempC, 'tempC');
  if (tempC < 0 || tempC >= 373.946) {
    throw new RangeError(`tempC must be between 0 and 373.946 °C for saturation properties, got ${tempC}`);
  }
  const T = tempC + 273.15;
  const th = 1 - T / TC;
  const s = Math.sqrt(th);
  const lnRatio = (TC / T) * (a[0] * th + a[1] * th * s + a[2] * th ** 3 + a[3] * th ** 3 * s + a[4] * th ** 4 + a[5] * th ** 7 * s);
  const p = PC * Math.exp(lnRatio);
  const dPdT =
    (-p / T) * (lnRatio + a[0] + 1.5 * a[1] * s + 3 * a[2] * th * th + 3.5 * a[3] * th * th * s + 4 * a[4] * th ** 3 + 7.5 * a[5] * th ** 6 * s);
  const rhoL = RHOC * (1 + b[0] * th ** (1 / 3) + b[1] * th ** (2 / 3) + b[2] * th ** (5 / 3) + b[3] * th ** (16 / 3) + b[4] * th ** (43 / 3) + b[5] * th ** (110 / 3));
  const rhoV = RHOC * Math.exp(c[0] * th ** (2 / 6) + c[1] * th ** (4 / 6) + c[2] * th ** (8 / 6) + c[3] * th ** (18 / 6) + c[4] * th ** (37 / 6) + c[5] * th ** (71 / 6));
  return {
    pressurePa: p,
    dPdTPaPerK: dPdT,
    liquidDensityKgPerM3: rhoL,
    vapourDensityKgPerM3: rhoV,
    latentHeatJPerKg: T * dPdT * (1 / rhoV - 1 / rhoL),
  };
}

/**
 * Latent heat of vaporisation of water at a temperature (the energy each kilogram evaporated
 * from a pool surface at that temperature carries away).
 * @param tempC water temperature, °C, 0 to 373.946
 * @returns J/kg
 * @throws TypeError / RangeError as `saturationState`.
 * @example latentHeatJPerKg(30) // ≈ 2.430e6 J/kg
 */
export function latentHeatJPerKg(tempC: number): number {
  return saturationState(tempC).latentHeatJPerKg;
}
