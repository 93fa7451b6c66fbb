/**
 * Display formatting in the user's unit system. Values are stored in SI; conversions happen
 * here, once, at the edge. Factors: 1 US gal = 3.785411784 L exactly (NIST SP 811 App. B.8);
 * °F = °C × 9/5 + 32 exactly.
 */
export type UnitSystem = 'si' | 'us';

const L_PER_GAL = 3.785411784;

export function formatFlow(m3PerS: number, units: UnitSystem): string {
  const lpm = m3PerS * 60_000;
  return units === 'us' ? `${(lpm / L_PER_GAL).toFixed(2)} gpm` : `${lpm.toFixed(2)} L/min`;
}

export function formatTemp(c: number, units: UnitSystem): string {
  return units === 'us' ? `${((c * 9) / 5 + 32).toFixed(1)} °F` : `${c.toFixed(1)} °C`;
}

export function formatDeltaT(k: number, units: UnitSystem): string {
  return units === 'us' ? `${((k * 9) / 5).toFixed(1)} °F` : `${k.toFixed(1)} K`;
}

export function formatVolume(m3: number, units: UnitSystem): string {
  return units === 'us' ? `${((m3 * 1000) / L_PER_GAL).toFixed(2)} gal` : `${(m3 * 1000).toFixed(1)} L`;
}

export const flowUnit = (u: UnitSystem) => (u === 'us' ? 'gpm' : 'L/min');
export const tempUnit = (u: UnitSystem) => (u === 'us' ? '°F' : '°C');
