import { describe, expect, test } from 'vitest';
import { recirculatingForecast } from '../../../analysis/forecast/recirculating-forecast';
import { coilHeater } from '../../../analysis/performance/heater-model';

// Energy balance (DOMAIN.md §3.3): with no losses a pool only warms, so the thermostat holds it at the target.
describe('thermostat', () => {
  const base = { poolMassKg: 56588, startTempC: 20, hours: 96, flowM3PerS: 2e-4, heater: coilHeater({ sourceTempC: 90, uaWPerK: 500 }), losses: false as const, targetTempC: 28 };
  test('stops heating at the target and holds there; without it the pool heats past', () => {
    const on = recirculatingForecast({ ...base, thermostat: true });
    const off = recirculatingForecast({ ...base });
    expect(off.finalTempC).toBeGreaterThan(35);
    expect(on.finalTempC).toBeGreaterThanOrEqual(28);
    expect(on.finalTempC).toBeLessThan(28.2);
    expect(on.hoursToTarget).toBeCloseTo(off.hoursToTarget!, 6);
  });
  test('needs a target', () => {
    expect(() => recirculatingForecast({ ...base, targetTempC: undefined, thermostat: true })).toThrow(/thermostat/);
  });
});
