/**
 * The exponential (Rosenbrock–Euler) step of a scalar heat balance, used by the recirculating
 * forecast. Over a step of length h the net heat rate is linearised about the temperature T₀ at
 * the start, q(T) ≈ q₀ + s·(T − T₀), and the linear equation M·cp·dT/dt = q₀ + s·(T − T₀) is solved
 * exactly (Hochbruck & Ostermann, "Exponential integrators", Acta Numerica 19 (2010), §2.2):
 *     z = s·h/(M·cp),   ΔT = q₀·h·φ₁(z)/(M·cp),   ∫₀ʰ (T − T₀) dt = q₀·h²·φ₂(z)/(M·cp),
 *     φ₁(z) = (eᶻ − 1)/z,   φ₂(z) = (eᶻ − 1 − z)/z².
 * For a balance that is linear in T (a constant-source coil with fixed cp, linear losses) the step
 * is exact at any length; for s < 0 it never overshoots the linearised equilibrium T₀ − q₀/s, so
 * it stays stable however long the step. The second integral gives each term's energy over the
 * step, E = q₀,ₖ·h + sₖ·∫(T − T₀)dt, and the terms add up to M·cp·ΔT exactly.
 */

/**
 * φ₁(z) = (eᶻ − 1)/z, with φ₁(0) = 1.
 * @example phi1(-1) // 0.6321
 */
export function phi1(z: number): number {
  return z === 0 ? 1 : Math.expm1(z) / z;
}

/**
 * φ₂(z) = (eᶻ − 1 − z)/z², with φ₂(0) = 1/2 (a Taylor series near 0, where the difference cancels).
 * @example phi2(-1) // 0.3679
 */
export function phi2(z: number): number {
  if (Math.abs(z) < 0.05) {
    return 1 / 2 + z * (1 / 6 + z * (1 / 24 + z * (1 / 120 + z * (1 / 720 + z * (1 / 5040 + z / 40320)))));
  }
  return (Math.expm1(z) - z) / (z * z);
}
