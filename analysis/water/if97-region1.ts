/**
 * IAPWS-IF97 region 1 (compressed and saturated liquid): the dimensionless Gibbs free energy
 * γ(π, τ) of Eq. (7) with the 34 coefficients of Table 2, and the properties derived from it
 * (Table 3). Source: IAPWS R7-97(2012), "Revised Release on the IAPWS Industrial Formulation
 * 1997 for the Thermodynamic Properties of Water and Steam". Verified against its Table 5.
 */

const I = [0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 2, 2, 2, 2, 2, 3, 3, 3, 4, 4, 4, 5, 8, 8, 21, 23, 29, 30, 31, 32];
const J = [-2, -1, 0, 1, 2, 3, 4, 5, -9, -7, -1, 0, 1, 3, -3, 0, 1, 3, 17, -4, 0, 6, -5, -2, 10, -8, -11, -6, -29, -31, -38, -39, -40, -41];
const N = [
  0.14632971213167, -0.84548187169114, -0.3756360367204e1, 0.33855169168385e1, -0.95791963387872,
  0.15772038513228, -0.16616417199501e-1, 0.81214629983568e-3, 0.28319080123804e-3, -0.60706301565874e-3,
  -0.18990068218419e-1, -0.32529748770505e-1, -0.21841717175414e-1, -0.5283835796993e-4, -0.47184321073267e-3,
  -0.30001780793026e-3, 0.47661393906987e-4, -0.44141845330846e-5, -0.72694996297594e-15, -0.31679644845054e-4,
  -0.28270797985312e-5, -0.85205128120103e-9, -0.22425281908e-5, -0.65171222895601e-6, -0.14341729937924e-12,
  -0.40516996860117e-6, -0.12734301741641e-8, -0.17424871230634e-9, -0.68762131295531e-18, 0.14478307828521e-19,
  0.26335781662795e-22, -0.11947622640071e-22, 0.18228094581404e-23, -0.93537087292458e-25,
];

/** Specific gas constant of water used by IF97, J/(kg·K) (IF97 Eq. 1). */
export const IF97_R_J_PER_KG_K = 461.526;

/** Properties of liquid water from IF97 region 1. */
export interface Region1State {
  /** specific volume, m³/kg */
  specificVolumeM3PerKg: number;
  /** density, kg/m³ */
  densityKgPerM3: number;
  /** specific enthalpy, J/kg (zero near the triple-point liquid, as in IAPWS-95) */
  enthalpyJPerKg: number;
  /** specific internal energy, J/kg */
  internalEnergyJPerKg: number;
  /** specific entropy, J/(kg·K) */
  entropyJPerKgK: number;
  /** isobaric specific heat capacity, J/(kg·K) */
  cpJPerKgK: number;
  /** speed of sound, m/s */
  soundSpeedMPerS: number;
}

/**
 * Evaluates IF97 region 1 at temperature `tempK` and pressure `pressurePa`. No range check:
 * callers (water-properties.ts) keep to 273.15 K ≤ T ≤ 623.15 K, psat(T) ≤ p ≤ 100 MPa.
 * @example if97Region1(320, 1e6).densityKgPerM3 // ≈ 989.83
 */
export function if97Region1(tempK: number, pressurePa: number): Region1State {
  const pi = pressurePa / 16.53e6;
  const tau = 1386 / tempK;
  const a = 7.1 - pi;
  const b = tau - 1.222;
  let g = 0, gp = 0, gpp = 0, gt = 0, gtt = 0, gpt = 0;
  for (let i = 0; i < 34; i++) {
    const ii = I[i], jj = J[i], n = N[i];
    const aI = a ** ii, bJ = b ** jj;
    g += n * aI * bJ;
    const aI1 = ii === 0 ? 0 : ii * a ** (ii - 1);
    const bJ1 = jj === 0 ? 0 : jj * b ** (jj - 1);
    gp -= n * aI1 * bJ;
    gpp += ii < 2 ? 0 : n * ii * (ii - 1) * a ** (ii - 2) * bJ;
    gt += n * aI * bJ1;
    gtt += jj === 0 || jj === 1 ? 0 : n * aI * jj * (jj - 1) * b ** (jj - 2);
    gpt -= n * aI1 * bJ1;
  }
  const R = IF97_R_J_PER_KG_K;
  const v = (pi * gp * R * tempK) / pressurePa;
  const h = tau * gt * R * tempK;
  const u = R * tempK * (tau * gt - pi * gp);
  const s = R * (tau * gt - g);
  const cp = -tau * tau * gtt * R;
  const w2 = (R * tempK * gp * gp) / ((gp - tau * gpt) ** 2 / (tau * tau * gtt) - gpp);
  return {
    specificVolumeM3PerKg: v,
    densityKgPerM3: 1 / v,
    enthalpyJPerKg: h,
    internalEnergyJPerKg: u,
    entropyJPerKgK: s,
    cpJPerKgK: cp,
    soundSpeedMPerS: Math.sqrt(w2),
  };
}
