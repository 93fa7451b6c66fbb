import { describe, expect, test } from 'vitest';
import { energyBudgetInput, energyBudgetPlot, forecastInputFromResult, forecastPlot } from '../../../app/_lib/plots';
import { recirculatingForecast } from '../../../analysis/forecast/recirculating-forecast';
import { coilHeater } from '../../../analysis/performance/heater-model';
import { group, num, renderPlot } from './support';

// DOMAIN.md §8 check 13: 15,000 gal (56,588 kg), Ts 90 °C, UA 500 W/K, 0.2 kg/s, from 20 °C, no losses, 24 h → 28.98 °C
const lossFree = recirculatingForecast({
  poolMassKg: 56588, startTempC: 20, hours: 24, flowM3PerS: 2e-4, heater: coilHeater({ sourceTempC: 90, uaWPerK: 500 }),
  losses: false, targetTempC: 25,
});

describe('forecastPlot', () => {
  const fig = forecastPlot(forecastInputFromResult(lossFree, { targetC: 25 }), 'si');
  const { svg, doc, x, y } = renderPlot(fig.options);

  test('ends the pool line at 28.98 °C after 24 h (DOMAIN.md §8 check 13, computed)', () => {
    expect(lossFree.finalTempC).toBeCloseTo(28.98, 1);
    expect(fig.summary).toMatch(/to 29\.0 °C in 24\.0 h/);
    const d = group(doc, 'water temperature')[0].querySelector('path')?.getAttribute('d') ?? '';
    const last = d.split(/[ML]/).filter(Boolean).pop()!.split(',').map(Number);
    expect(last[0]).toBeCloseTo(x(24), 1);
    expect(last[1]).toBeCloseTo(y(lossFree.finalTempC), 1);
  });

  test('draws the target line and marks the time it is reached', () => {
    expect(num(group(doc, 'target line')[0].querySelector('line'), 'y1')).toBeCloseTo(y(25), 6);
    expect(num(group(doc, 'time to target line')[0].querySelector('line'), 'x1')).toBeCloseTo(x(lossFree.hoursToTarget!), 6);
  });

  test('draws the 49 °C scald line the heater outlet crosses (DOMAIN.md §5 product rule)', () => {
    expect(lossFree.maxOutletTempC).toBeGreaterThan(49);
    const ys = [...group(doc, 'caution line')].map((g) => num(g.querySelector('line'), 'y1'));
    expect(ys.some((v) => Math.abs(v - y(49)) < 1e-6)).toBe(true);
    expect(svg).not.toMatch(/NaN|Infinity|undefined/);
  });

  test('in US units draws the 25 °C target at 77 °F (NIST SP 811: °F = 1.8·°C + 32, exact)', () => {
    const us = renderPlot(forecastPlot(forecastInputFromResult(lossFree, { targetC: 25 }), 'us').options);
    expect(us.svg).toMatch(/Temperature \(°F\)/);
    expect(num(group(us.doc, 'target line')[0].querySelector('line'), 'y1')).toBeCloseTo(us.y(77), 6);
  });

  test('always draws the 40 °C spa limit for a tub (DOMAIN.md §5)', () => {
    const tub = renderPlot(forecastPlot(forecastInputFromResult(lossFree, { water: 'tub' }), 'si').options);
    expect([...group(tub.doc, 'caution label')].some((g) => /spa limit 40\.0 °C/.test(g.textContent ?? ''))).toBe(true);
  });
});

describe('energyBudgetPlot', () => {
  const withLosses = recirculatingForecast({
    poolVolumeM3: 20, startTempC: 18, hours: 48, flowM3PerS: 2e-4, heater: coilHeater({ sourceTempC: 90, uaWPerK: 500 }),
    losses: { weather: { airTempC: 20, relativeHumidity: 0.5, windMPerS: 1, solarWPerM2: 200 }, surfaceAreaM2: 18 },
  });
  const input = energyBudgetInput(withLosses.energy, 48);

  test('draws six terms and the net change, gains right of zero and losses left', () => {
    const fig = energyBudgetPlot(input, 'si');
    const { svg, doc, x } = renderPlot(fig.options);
    const rects = [...group(doc, 'energy terms')[0].querySelectorAll('rect')];
    expect(rects.length).toBe(7);
    const zero = x(0);
    const evap = input.terms.findIndex((t) => t.term === 'evaporation');
    expect(num(rects[evap], 'x') + num(rects[evap], 'width')).toBeCloseTo(zero, 0);
    expect(num(rects[0], 'x')).toBeCloseTo(zero, 0);
    expect(fig.summary).toMatch(/largest loss is evaporation/);
    expect(svg).not.toMatch(/NaN|Infinity|undefined/);
  });

  test('labels the heater energy in therm in US units (NIST SP 811 / EIA: 1 therm = 100,000 Btu_IT = 105,505,585.262 J)', () => {
    const fig = energyBudgetPlot(input, 'us');
    const { doc } = renderPlot(fig.options);
    const therm = withLosses.energy.heaterJ / 105505585.262;
    const labels = [...group(doc, 'energy labels')].flatMap((g) => [...g.querySelectorAll('text')].map((t) => t.textContent));
    expect(labels).toContain(`+${therm.toFixed(therm >= 100 ? 0 : therm >= 10 ? 1 : 2)}`);
    expect(fig.options.x && (fig.options.x as { label?: string }).label).toMatch(/therm/);
  });
});
