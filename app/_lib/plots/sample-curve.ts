import { displayUnit } from '@/app/_contracts/units';

/**
 * The static sample on the landing page: an invented coil (Ts 85 °C, UA 450 W/K, inlet 18 °C)
 * drawn with the constant-source model, and a few invented trial points around it.
 */
export function sampleCoilData() {
  const ts = 85;
  const ua = 450;
  const tin = 18;
  const cp = 4181;
  const rho = 997;
  const lpm = displayUnit('volumeFlow', 'si');
  const outlet = (q: number) => ts - (ts - tin) * Math.exp(-ua / (rho * lpm.to(q) * cp));
  const curve = Array.from({ length: 91 }, (_, i) => {
    const q = 1.5 + i * 0.25;
    const t = outlet(q);
    return { q, t, lo: t - 1.1, hi: t + 1.1 };
  });
  const jitter = [0.6, -0.4, 0.3, -0.7, 0.2, 0.5, -0.3, -0.5, 0.4, -0.2, 0.1];
  const points = [2, 3.5, 5, 6.5, 8, 10, 12, 14, 16, 18, 21].map((q, i) => ({ q, t: outlet(q) + jitter[i] }));
  return { curve, points, tin };
}
