/**
 * Energy to raise a body of water by one kelvin, E = ρ·V·cp (DOMAIN.md §3.2), with IF97
 * properties at the water temperature, and the loss-free heat-up rate dT/dt = q/(ρ·V·cp).
 */
import { requireFinite, requirePositive } from '../units/guards';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../water/water-properties';

/**
 * @param volumeM3 water volume, m³
 * @param tempC water temperature, °C (default 25)
 * @returns J/K
 * @throws TypeError / RangeError for a non-positive volume or a temperature outside 0–100 °C.
 * @example energyPerDegreeJPerK(40) // ≈ 1.668e8 J/K
 */
export function energyPerDegreeJPerK(volumeM3: number, tempC = 25): number {
  const v = requirePositive(volumeM3, 'volumeM3');
  return waterDensityKgPerM3(tempC) * v * waterCpJPerKgK(tempC);
}

/**
 * Loss-free heat-up rate of a pool receiving `heatW`.
 * @returns K/h
 * @example heatUpRateKPerH(20000, 40) // ≈ 0.432 K/h
 */
export function heatUpRateKPerH(heatW: number, volumeM3: number, tempC = 25): number {
  return (requireFinite(heatW, 'heatW') * 3600) / energyPerDegreeJPerK(volumeM3, tempC);
}
