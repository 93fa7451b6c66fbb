/**
 * Display conversions for client components (values are stored in SI). Exact factors:
 * 1 US gal = 3.785411784 L (NIST SP 811 App. B.8); °F = °C × 9/5 + 32.
 */
export type Units = 'si' | 'us';
const L_PER_GAL = 3.785411784;
export const flowOut = (m3PerS: number, u: Units) => (u === 'us' ? (m3PerS * 60_000) / L_PER_GAL : m3PerS * 60_000);
export const flowIn = (v: number, u: Units) => (u === 'us' ? (v * L_PER_GAL) / 60_000 : v / 60_000);
export const tempOut = (c: number, u: Units) => (u === 'us' ? (c * 9) / 5 + 32 : c);
export const tempIn = (v: number, u: Units) => (u === 'us' ? ((v - 32) * 5) / 9 : v);
export const dtOut = (k: number, u: Units) => (u === 'us' ? (k * 9) / 5 : k);
export const volOut = (m3: number, u: Units) => (u === 'us' ? (m3 * 1000) / L_PER_GAL : m3 * 1000);
export const volIn = (v: number, u: Units) => (u === 'us' ? (v * L_PER_GAL) / 1000 : v / 1000);
export const flowUnit = (u: Units) => (u === 'us' ? 'gpm' : 'L/min');
export const tempUnit = (u: Units) => (u === 'us' ? '°F' : '°C');
export const dtUnit = (u: Units) => (u === 'us' ? '°F' : 'K');
export const volUnit = (u: Units) => (u === 'us' ? 'gal' : 'L');
