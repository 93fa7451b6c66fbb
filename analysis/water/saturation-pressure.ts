/**
 * Saturation line of water from IAPWS-IF97 region 4: the saturation-pressure equation (30) and
 * its inverse, the saturation-temperature equation (31), with the coefficients of Table 34.
 * Source: IAPWS R7-97(2012). Valid 273.15 K ≤ T ≤ 647.096 K; verified against Tables 35 and 36.
 */
import { requireFinite } from '../units/guards';

const n = [
  0.11670521452767e4, -0.72421316598102e6, -0.17073846940092e2, 0.1202082470247e5, -0.32325550322333e7,
  0.1491510861353e2, -0.48232657361591e4, 0.40511340542057e6, -0.23855557567849, 0.65017534844798e3,
];

/**
 * Saturation (vapour) pressure over liquid water.
 * @param tempC water temperature, °C, 0 to 373.946 (triple point region to critical point)
 * @returns pressure, Pa
 * @throws TypeError when not finite; RangeError outside 0–373.946 °C.
 * @example saturationPressurePa(30) // ≈ 4246.7
 */
export function saturationPressurePa(tempC: number): number {
  requireFinite(tempC, 'tempC');
  if (tempC < 0 || tempC > 373.946) {
    throw new RangeError(`tempC must be between 0 and 373.946 °C for the saturation line, got ${tempC}`);
  }
  return saturationPressureUncheckedPa(tempC + 273.15);
}

/** Eq. (30) without argument checks (for inner loops); temperature in K, result in Pa. */
export function saturationPressureUncheckedPa(tempK: number): number {
  const th = tempK + n[8] / (tempK - n[9]);
  const A = th * th + n[0] * th + n[1];
  const B = n[2] * th * th + n[3] * th + n[4];
  const C = n[5] * th * th + n[6] * th + n[7];
  const x = (2 * C) / (-B + Math.sqrt(B * B - 4 * A * C));
  return x ** 4 * 1e6;
}

/**
 * Eq. (30) and its derivative dp/dT, without argument checks (for inner loops: the forecast
 * linearises evaporation about the pool temperature each step). Differentiated by hand through
 * ϑ = T + n9/(T − n10) and the quadratic root of Eq. (30).
 * @param tempK temperature, K
 * @param out out[0] = pressure, Pa; out[1] = dp/dT, Pa/K
 * @example saturationPressureAndSlopeUnchecked(300, out) // out ≈ [3536.6, 207.9]
 */
export function saturationPressureAndSlopeUnchecked(tempK: number, out: Float64Array): void {
  const u = tempK - n[9];
  const th = tempK + n[8] / u;
  const dth = 1 - n[8] / (u * u);
  const A = th * th + n[0] * th + n[1], dA = 2 * th + n[0];
  const B = n[2] * th * th + n[3] * th + n[4], dB = 2 * n[2] * th + n[3];
  const C = n[5] * th * th + n[6] * th + n[7], dC = 2 * n[5] * th + n[6];
  const D = Math.sqrt(B * B - 4 * A * C);
  const dD = (B * dB - 2 * (dA * C + A * dC)) / D;
  const den = D - B, dDen = dD - dB;
  const x = (2 * C) / den;
  const dx = (2 * (dC * den - C * dDen)) / (den * den);
  const x3 = x * x * x;
  out[0] = x3 * x * 1e6;
  out[1] = 4 * x3 * dx * dth * 1e6;
}

/**
 * Saturation (boiling) temperature at a pressure.
 * @param pressurePa absolute pressure, Pa, 611.213 Pa to 22.064 MPa
 * @returns temperature, °C
 * @throws TypeError when not finite; RangeError outside the saturation range.
 * @example saturationTempC(101325) // 99.974 (water boils at 212 °F at sea level, common practice)
 */
export function saturationTempC(pressurePa: number): number {
  requireFinite(pressurePa, 'pressurePa');
  if (pressurePa < 611.213 || pressurePa > 22.064e6) {
    throw new RangeError(`pressurePa must be between 611.213 Pa and 22.064 MPa, got ${pressurePa}`);
  }
  return saturationTempUncheckedC(pressurePa);
}

/**
 * Eq. (31) without argument checks: below the triple-point pressure it extrapolates over
 * supercooled liquid (a dew point below 0 °C); −Infinity for a pressure of 0 or less.
 * @example saturationTempUncheckedC(101325) // 99.974
 */
export function saturationTempUncheckedC(pressurePa: number): number {
  if (!(pressurePa > 0)) return -Infinity;
  const beta = (pressurePa / 1e6) ** 0.25;
  const E = beta * beta + n[2] * beta + n[5];
  const F = n[0] * beta * beta + n[3] * beta + n[6];
  const G = n[1] * beta * beta + n[4] * beta + n[7];
  const D = (2 * G) / (-F - Math.sqrt(F * F - 4 * E * G));
  const tK = (n[9] + D - Math.sqrt((n[9] + D) ** 2 - 4 * (n[8] + n[9] * D))) / 2;
  return tK - 273.15;
}
