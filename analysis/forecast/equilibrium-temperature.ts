/**
 * Equilibrium pool temperature: where the mean heating rate balances the mean losses, under the
 * forecast period's mean weather, heater duty (fraction of hours on) and cover fraction, found by
 * bisection on 0–100 °C. A mean of the terms, not of their products: a guide, not a forecast.
 */
import type { HeaterModel } from '../performance/heater-model';
import { fastDensityKgPerM3 } from '../water/property-table';
import { saturationPressureUncheckedPa } from '../water/saturation-pressure';
import { convectionCoefficient, evaporationWPerM2, STEFAN_BOLTZMANN } from './surface-losses';
import type { Terms } from './loss-terms';

/**
 * @returns the temperature, °C, or null with a note when gains and losses do not balance in 0–100 °C
 * @example equilibriumTempC({ heater, terms: null, flowM3PerS: 2e-4, massFlowKgPerS: 0, heaterOn, startHourOfDay: 0, hours: 24 })
 */
export function equilibriumTempC(o: {
  heater: HeaterModel; terms: Terms | null; flowM3PerS: number; massFlowKgPerS: number; heaterOn: Uint8Array;
  startHourOfDay: number; hours: number;
}): { tempC: number | null; note: string } {
  const { heater, terms, heaterOn } = o;
  const flow = o.flowM3PerS, massFlow = o.massFlowKgPerS, startHour = o.startHourOfDay;
  const nH = Math.max(1, Math.ceil(o.hours));
  const duty = Array.from({ length: nH }, (_, h) => heaterOn[(startHour + h) % 24]).reduce((a, b) => a + b, 0) / nH;
  let ta = 0, pa = 0, wind = 0, sky4 = 0, solar = 0, cov = 0;
  if (terms) {
    const w = terms.weather;
    for (let h = 0; h < nH; h++) {
      const k = h % w.hours;
      ta += w.airTempC[k]; pa += w.vapourPressurePa[k]; wind += w.windMPerS[k]; solar += w.solarWPerM2[k];
      sky4 += (w.skyTempC[k] + 273.15) ** 4;
      cov += terms.cover[(startHour + h) % 24];
    }
    ta /= nH; pa /= nH; wind /= nH; solar /= nH; sky4 /= nH; cov /= nH;
  }
  const net = (T: number): number => {
    const rho = fastDensityKgPerM3(T);
    const vdot = massFlow > 0 ? massFlow / rho : flow;
    let q = vdot > 0 ? duty * heater.heatW(vdot, T) : 0;
    if (terms) {
      const a = terms.area;
      const f = (c: number) => 1 - cov + cov * c;
      q += terms.solar * a * solar * f(terms.cSolar);
      q -= terms.evap * a * evaporationWPerM2(saturationPressureUncheckedPa(T + 273.15), pa, wind) * f(terms.cEvap);
      q -= terms.conv * a * convectionCoefficient(wind, terms.convModel) * (T - ta) * f(terms.cConv);
      q -= terms.rad * a * terms.emis * STEFAN_BOLTZMANN * ((T + 273.15) ** 4 - sky4) * f(terms.cRad);
      q -= terms.wallUA * (T - (terms.groundC ?? ta));
    }
    return q;
  };
  let lo = 0, hi = 100;
  const nlo = net(lo), nhi = net(hi);
  if (!(nlo > 0)) {
    if (terms) return { tempC: null, note: 'No equilibrium above 0 °C: losses exceed gains even for water at 0 °C.' };
    return {
      tempC: null,
      note: nlo === 0 && nhi === 0
        ? 'No equilibrium: losses are off and the heater delivers no heat (no flow, or no heater hours), so the pool stays where it starts.'
        : 'No equilibrium above 0 °C: losses are off and the heater takes heat out of water even at 0 °C.',
    };
  }
  if (nhi > 0) {
    return {
      tempC: null,
      note: terms
        ? 'No equilibrium below 100 °C: gains exceed losses up to boiling. The water would keep heating; see the cautions.'
        : 'No equilibrium below 100 °C: losses are off and the heater keeps adding heat up to boiling. The water would keep heating; see the cautions.',
    };
  }
  for (let i = 0; i < 200 && hi - lo > 1e-9; i++) {
    const mid = (lo + hi) / 2;
    if (net(mid) > 0) lo = mid; else hi = mid;
  }
  return { tempC: (lo + hi) / 2, note: 'Equilibrium under the mean weather, heater duty and cover fraction of the forecast period.' };
}
