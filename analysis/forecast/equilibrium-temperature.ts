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

/** What the equilibrium and the hours to hold a temperature read of a forecast (its mean period). */
export interface MeanBalanceInput {
  heater: HeaterModel; terms: Terms | null; flowM3PerS: number; massFlowKgPerS: number; heaterOn: Uint8Array;
  startHourOfDay: number; hours: number;
}

/**
 * The mean heat balance of a forecast period: the heater's duty (fraction of hours on), its heat
 * when on at a pool temperature, and `add(T, q)`: q plus the mean solar gain minus the mean losses
 * (evaporation, convection, radiation, walls) at T, W.
 */
export function meanBalance(o: MeanBalanceInput) {
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
  const heaterW = (T: number): number => {
    const rho = fastDensityKgPerM3(T);
    const vdot = massFlow > 0 ? massFlow / rho : flow;
    return vdot > 0 ? heater.heatW(vdot, T) : 0;
  };
  const add = (T: number, q: number): number => {
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
  return { duty, heaterW, add };
}

/**
 * @returns the temperature, °C, or null with a note when gains and losses do not balance in 0–100 °C
 * @example equilibriumTempC({ heater, terms: null, flowM3PerS: 2e-4, massFlowKgPerS: 0, heaterOn, startHourOfDay: 0, hours: 24 })
 */
export function equilibriumTempC(o: MeanBalanceInput): { tempC: number | null; note: string } {
  const { terms } = o;
  // duty · heat is the forecast's heater term (0 without flow), the other terms are added to it
  const { duty, heaterW, add } = meanBalance(o);
  const net = (T: number): number => add(T, duty * heaterW(T));
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

/**
 * Heater hours per day that hold the pool at a temperature under the period's mean weather and
 * cover: where duty · heater heat + solar gain − losses = 0 at that temperature (the mean balance
 * is linear in the duty), × 24 h.
 * @param targetC the temperature to hold, °C (0–100)
 * @returns hours per day (0 when the sun alone holds it), or null with a note when even 24 h a day
 *   cannot, or the heater gives no heat at that temperature
 * @throws RangeError for a target outside 0–100 °C
 * @example holdHoursPerDay({ heater, terms, flowM3PerS: 2e-4, massFlowKgPerS: 0, heaterOn, startHourOfDay: 0, hours: 24 }, 28).hoursPerDay
 */
export function holdHoursPerDay(o: MeanBalanceInput, targetC: number): { hoursPerDay: number | null; note: string } {
  if (!(targetC >= 0 && targetC <= 100)) throw new RangeError(`targetC must be within 0–100 °C, got ${targetC}`);
  const { heaterW, add } = meanBalance(o);
  const need = -add(targetC, 0);
  if (need <= 0) return { hoursPerDay: 0, note: `The sun and the air alone hold ${targetC} °C under the mean weather: no heater hours are needed.` };
  const hw = heaterW(targetC);
  if (!(hw > 0)) return { hoursPerDay: null, note: `The heater gives no heat to water at ${targetC} °C (no flow, or its source is not hotter): it cannot hold that temperature.` };
  const h = (24 * need) / hw;
  if (h > 24) return { hoursPerDay: null, note: `Even 24 h a day cannot hold ${targetC} °C: the mean losses (${need.toFixed(0)} W) exceed the heater's ${hw.toFixed(0)} W at that temperature.` };
  return { hoursPerDay: h, note: `Heater hours per day that hold ${targetC} °C under the mean weather and cover of the forecast period (mean losses ${need.toFixed(0)} W, heater ${hw.toFixed(0)} W when on).` };
}
