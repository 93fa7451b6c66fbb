/**
 * Heat exchanged at a pool's water surface and walls (DOMAIN.md §3.4), each per unit area so the
 * forecast can scale and switch them.
 *
 * - Evaporation: the Carrier equation of the ASHRAE Handbook natatorium chapter (as quoted by
 *   Smith, Löf & Jones, ASHRAE Trans. 1998), SI form W = A·(pw − pa)·(0.089 + 0.0782·V)/Y
 *   [kg/s; m², kPa, m/s, kJ/kg], so the heat Q = W·Y = A·(pw − pa)·(0.089 + 0.0782·V) kW.
 *   pw is the saturation pressure at the water temperature, pa the actual vapour pressure of the
 *   air (saturation pressure at the dew point). Multiply by an activity factor and by a measured
 *   correction (0.72–0.82 for an unoccupied outdoor pool, Smith et al. 1994).
 * - Convection: h·(Tw − Ta) with h = 3.1 + 4.1·V W/(m²·K) (used in pool-heating guidance) or
 *   McAdams 5.7 + 3.8·V (both from memory, DOMAIN.md §3.4).
 * - Long-wave radiation to the sky: ε·σ·(Tw⁴ − Tsky⁴), ε = 0.95.
 * - Solar gain: α·G, α 0.85 light / 0.90 dark pools (Kalogirou, citing ISO/TR).
 */

/** Stefan–Boltzmann constant, W/(m²·K⁴) (CODATA 2018, exact in the 2019 SI). */
export const STEFAN_BOLTZMANN = 5.670374419e-8;

/**
 * Evaporative heat flux by the Carrier/ASHRAE pool equation, W/m² (negative = condensation).
 * @param waterVapourPa saturation pressure at the water temperature, Pa
 * @param airVapourPa actual vapour pressure of the air (psat at the dew point), Pa
 * @param airSpeedMPerS air speed over the water, m/s
 * @example evaporationWPerM2(3000, 1500, 1) // 250.8 W/m²
 */
export function evaporationWPerM2(waterVapourPa: number, airVapourPa: number, airSpeedMPerS: number): number {
  return (waterVapourPa - airVapourPa) * (0.089 + 0.0782 * airSpeedMPerS); // kPa·kW/m² ↔ Pa·W/m²
}

/**
 * The IP form of the same equation, W = A·(pw − pa)·(95 + 0.425·V)/Y.
 * @param areaFt2 ft²; pressures in inHg; air speed ft/min; latent heat Btu/lb
 * @returns evaporation, lb/h
 * @example carrierEvaporationLbPerH(500, 1.0, 0.5, 0, 1050) // ≈ 22.6 lb/h
 */
export function carrierEvaporationLbPerH(areaFt2: number, waterInHg: number, airInHg: number, airSpeedFtPerMin: number, latentBtuPerLb: number): number {
  return (areaFt2 * (waterInHg - airInHg) * (95 + 0.425 * airSpeedFtPerMin)) / latentBtuPerLb;
}

/** Convection coefficient correlations by wind speed. */
export type ConvectionModel = 'pool-guidance' | 'mcadams';

/**
 * Convective heat transfer coefficient, W/(m²·K).
 * @example convectionCoefficient(2, 'pool-guidance') // 11.3
 */
export function convectionCoefficient(windMPerS: number, model: ConvectionModel = 'pool-guidance'): number {
  return model === 'mcadams' ? 5.7 + 3.8 * windMPerS : 3.1 + 4.1 * windMPerS;
}

/**
 * Net long-wave radiation from the water to the sky, W/m².
 * @example skyRadiationWPerM2(30, 10) // ≈ 108.7 W/m²
 */
export function skyRadiationWPerM2(waterTempC: number, skyTempC: number, emissivity = 0.95): number {
  const tw = waterTempC + 273.15, ts = skyTempC + 273.15;
  const tw2 = tw * tw, ts2 = ts * ts;
  return emissivity * STEFAN_BOLTZMANN * (tw2 * tw2 - ts2 * ts2);
}
