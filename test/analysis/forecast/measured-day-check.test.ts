import { describe, expect, test } from 'vitest';
import { measuredDayCheck } from '../../../analysis/forecast/measured-day-check';
import { fixedRiseHeater } from '../../../analysis/performance/heater-model';
import type { ForecastInput } from '../../../analysis/forecast/recirculating-forecast';
import { fastCpJPerKgK } from '../../../analysis/water/property-table';

// A fixed-rise heater without losses: Tend = T0 + ṁ·rise·t/M exactly (closed form, common practice), so the
// prediction's sensitivity to the start is 1 and to the mass −(Tend − T0)/M; GUM first order (JCGM 100:2008 §5.1).
const M = 10_000, m = 0.2, rise = 5, hours = 10;
/** the heat capacity measuredDay takes: IAPWS-IF97 water at the mean of the two ends */
const cpAt = (end: number) => fastCpJPerKgK((end + predicted) / 2);
const base: ForecastInput = { poolMassKg: M, startTempC: 20, hours, stepS: 3600, massFlowKgPerS: m, heater: fixedRiseHeater(rise), losses: false };
const predicted = 20 + (m * rise * hours * 3600) / M; // 23.6 °C

describe('a measured day against its forecast, with the uncertainty of the unmodelled gain', () => {
  test('the residual and gain are observed − predicted and r·M·cp; u(r) = √2·u_T when ∂Tpred/∂T0 = 1', () => {
    const c = measuredDayCheck(base, predicted + 1, { thermometerK: 0.3, volumeRelative: 0 });
    expect(c.predictedEndC).toBeCloseTo(predicted, 9);
    expect(c.residualK).toBeCloseTo(1, 9);
    expect(c.unmodelledGainJ / (M * cpAt(predicted + 1))).toBeCloseTo(1, 9);
    expect(c.residualUK).toBeCloseTo(0.3 * Math.SQRT2, 6);
    expect(c.gainUJ / (M * cpAt(predicted + 1) * 0.3 * Math.SQRT2)).toBeCloseTo(1, 6);
    expect(c.significant).toBe(true);
    expect(c.verdict).toMatch(/^The pool gained about 11\.6 kWh/);
  });

  test('the volume term: ∂G/∂M = r·cp − M·cp·∂Tpred/∂M with ∂Tpred/∂M = −(Tpred − T0)/M (closed form)', () => {
    const c = measuredDayCheck(base, predicted + 1, { thermometerK: 0, volumeRelative: 0.05 });
    const cp = cpAt(predicted + 1);
    const dGdM = 1 * cp + cp * (predicted - 20);
    // within 0.5 %: the closed form takes one cp, the forecast water's cp follows its temperature
    expect(c.gainUJ / (dGdM * 0.05 * M)).toBeCloseTo(1, 2);
  });

  test('a residual inside twice its uncertainty is within the measurement, said in plain words; a deficit names the losses', () => {
    const near = measuredDayCheck(base, predicted + 0.2, { thermometerK: 0.3, volumeRelative: 0.05 });
    expect(near.significant).toBe(false);
    expect(near.verdict).toMatch(/^Within the measurement uncertainty/);
    const cold = measuredDayCheck(base, predicted - 2, { thermometerK: 0.1, volumeRelative: 0.02 });
    expect(cold.verdict).toMatch(/^The pool lost about .* losses under-estimated/);
  });

  test('negative uncertainties are refused', () => {
    expect(() => measuredDayCheck(base, 24, { thermometerK: -1, volumeRelative: 0 })).toThrow(RangeError);
  });
});
