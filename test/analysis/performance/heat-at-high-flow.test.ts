import { describe, expect, test } from 'vitest';
import { recirculatingForecast } from '../../../analysis/forecast/recirculating-forecast';
import { coilHeater } from '../../../analysis/performance/heater-model';
import { coilPerformance } from '../../../analysis/performance/coil-ntu';
import { risePerHourTable } from '../../../analysis/pool/mixing';
import { fastCpJPerKgK, fastDensityKgPerM3 } from '../../../analysis/water/property-table';

// DOMAIN.md §1.2 (closed form): q = −expm1(−NTU)·ṁ·cp·(Ts − Tin) → UA·(Ts − Tin) as ṁ → ∞ (NTU → 0).
// Computing ṁ·cp·(Tout − Tin) after Tout cancels to nothing there.
const Ts = 80, UA = 430, Tin = 20;
const ceiling = UA * (Ts - Tin);

describe('delivered heat at NTU → 0 tends to UA·(Ts − Tin) (closed form, DOMAIN.md §1.2)', () => {
  test.each([1e3, 1e6, 1e9])('the coil heater at %d m³/s', (flow) => {
    const ntu = UA / (fastDensityKgPerM3(Tin) * flow * fastCpJPerKgK(Tin));
    // q/q∞ = (1 − e^(−N))/N = 1 − N/2 + … (DOMAIN.md §1.2)
    expect(coilHeater({ sourceTempC: Ts, uaWPerK: UA }).heatW(flow, Tin) / ceiling).toBeCloseTo(1 - ntu / 2, 12);
    const ntu2 = UA / (flow * 1000 * 4186);
    expect(coilPerformance({ sourceTempC: Ts, inletTempC: Tin, uaWPerK: UA, massFlowKgPerS: flow * 1000, cpJPerKgK: 4186 }).heatW / ceiling).toBeCloseTo(1 - ntu2 / 2, 12);
  });
  test('the forecast: one minute at 1e9 m³/s into a very large pool delivers UA·(Ts − Tp)·60 s', () => {
    const r = recirculatingForecast({ poolMassKg: 1e12, startTempC: Tin, hours: 1 / 60, stepS: 60, flowM3PerS: 1e9, heater: coilHeater({ sourceTempC: Ts, uaWPerK: UA }), losses: false });
    expect(r.energy.heaterJ / (ceiling * 60)).toBeCloseTo(1, 9);
  });
  test('the rise-per-hour table at 1e9 m³/s: UA·(Ts − Tp)·3600/(ρ·V·cp)', () => {
    const [[rise]] = risePerHourTable(coilHeater({ sourceTempC: Ts, uaWPerK: UA }), [1e9], [10], Tin);
    expect(rise / ((ceiling * 3600) / (fastDensityKgPerM3(Tin) * 10 * fastCpJPerKgK(Tin)))).toBeCloseTo(1, 9);
  });
});

describe('the equilibrium note with losses off (common practice: no losses, no heat, no change)', () => {
  test('no heater hours: the note says the heater delivers no heat, not that losses exceed gains', () => {
    const r = recirculatingForecast({ poolMassKg: 1000, startTempC: 20, hours: 2, flowM3PerS: 1e-4, heater: coilHeater({ sourceTempC: Ts, uaWPerK: UA }), heaterHours: [], losses: false });
    expect(r.equilibriumTempC).toBeNull();
    expect(r.equilibriumNote).not.toMatch(/losses exceed gains/);
    expect(r.equilibriumNote).toMatch(/losses are off and the heater delivers no heat/);
    expect(r.finalTempC).toBe(20);
  });
});
