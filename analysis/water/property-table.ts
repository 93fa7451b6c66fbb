/**
 * A precomputed table of density and cp at 1 atm, 0–100 °C in 0.05 K steps, with linear
 * interpolation, for inner loops (the recirculating forecast evaluates properties every step).
 * Interpolation error against IF97 itself is below 1e-7 relative for both properties.
 */
import { if97Region1 } from './if97-region1';
import { STANDARD_ATMOSPHERE_PA } from './water-properties';
import { saturationState } from './latent-heat';

const STEP_K = 0.05;
const COUNT = Math.round(100 / STEP_K) + 1;
let rho: Float64Array | null = null;
let cp: Float64Array | null = null;

function build(): void {
  rho = new Float64Array(COUNT);
  cp = new Float64Array(COUNT);
  for (let i = 0; i < COUNT; i++) {
    const s = if97Region1(273.15 + i * STEP_K, STANDARD_ATMOSPHERE_PA);
    rho[i] = s.densityKgPerM3;
    cp[i] = s.cpJPerKgK;
  }
}

function lookup(table: Float64Array, tempC: number): number {
  // Clamp to the table: callers have validated the range; clamping keeps a transient overshoot
  // (an Euler step a hair past 100 °C) from producing NaN.
  const x = Math.min(Math.max(tempC, 0), 100) / STEP_K;
  const i = Math.min(Math.floor(x), COUNT - 2);
  const f = x - i;
  return table[i] + f * (table[i + 1] - table[i]);
}

/**
 * Density of water at 1 atm by table interpolation, kg/m³; input clamped to 0–100 °C.
 * @example fastDensityKgPerM3(20) // 998.21
 */
export function fastDensityKgPerM3(tempC: number): number {
  if (rho === null) build();
  return lookup(rho as Float64Array, tempC);
}

/**
 * Isobaric specific heat of water at 1 atm by table interpolation, J/(kg·K); input clamped.
 * @example fastCpJPerKgK(20) // 4184.4
 */
export function fastCpJPerKgK(tempC: number): number {
  if (cp === null) build();
  return lookup(cp as Float64Array, tempC);
}

let latent: Float64Array | null = null;

/**
 * Latent heat of vaporisation by table interpolation (SR1-86 auxiliary equations, see
 * latent-heat.ts), J/kg; input clamped to 0–100 °C.
 * @example fastLatentHeatJPerKg(30) // ≈ 2.430e6
 */
export function fastLatentHeatJPerKg(tempC: number): number {
  if (latent === null) {
    latent = new Float64Array(COUNT);
    for (let i = 0; i < COUNT; i++) latent[i] = saturationState(Math.max(i * STEP_K, 0.01)).latentHeatJPerKg;
  }
  return lookup(latent, tempC);
}
