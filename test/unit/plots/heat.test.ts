import { describe, expect, test } from 'vitest';
import { heatInputFromFit, heatPlot, type HeatPlotInput } from '../../../app/_lib/plots';
import { chooseFlow } from '../../../analysis/performance/choose-flow';
import { coilTrials, fitOrThrow, group, LPM, num, renderPlot } from './support';

const coil = fitOrThrow('coil');
const expInlet = fitOrThrow('exp-inlet');

describe('heat plot of the coil fit', () => {
  const choice = chooseFlow(coil, 20);
  const input = heatInputFromFit(coil, { choice, excluded: [{ flowM3PerS: 11 * LPM, outletTempC: 60 }] });
  const fig = heatPlot(input, 'si');
  const { svg, doc, x, y } = renderPlot(fig.options);

  test('draws the ceiling UA·(Ts − Tin) near 35 kW (DOMAIN.md §1.2: q∞ = 35,000 W for Ts 90 °C, Tin 20 °C, UA 500 W/K)', () => {
    expect(input.ceilingW! / 1000).toBeCloseTo(35, 0);
    expect(num(group(doc, 'ceiling line')[0].querySelector('line'), 'y1')).toBeCloseTo(y(input.ceilingW! / 1000), 6);
  });

  test('shows no optimum: heat keeps rising with flow (DOMAIN.md §1.2)', () => {
    expect(group(doc, 'optimum').length).toBe(0);
    expect(fig.summary).toMatch(/there is no optimum/);
    const q = input.curve.map((c) => c.heatW);
    expect(q.every((v, i) => i === 0 || v > q[i - 1])).toBe(true);
  });

  test('marks the recommended flow at 90 % of the ceiling, NTU 0.2146, and says it is extrapolated (DOMAIN.md §1.2, computed)', () => {
    const flow = coil.params.UA.value / (0.2146 * 998.2 * 4184); // ρ and cp of water at 20 °C (IF97, as chooseFlow uses)
    expect(input.recommended!.flowM3PerS).toBeCloseTo(choice.ceiling!.flowM3PerS, 12);
    expect(input.recommended!.flowM3PerS / flow).toBeCloseTo(1, 3);
    expect(num(group(doc, 'recommended flow line')[0].querySelector('line'), 'x1')).toBeCloseTo(x(input.recommended!.flowM3PerS / LPM), 6);
    expect(group(doc, 'recommended flow label')[0].textContent).toMatch(/\(extrapolated\)/);
    expect(input.recommended!.heatW / input.ceilingW!).toBeCloseTo(0.9, 2);
  });

  test('draws the trials (excluded hollow), both bands and the extrapolated region, with no NaN', () => {
    expect(group(doc, 'trials')[0].querySelectorAll('circle').length).toBe(coilTrials().x.length);
    expect(group(doc, 'excluded trials')[0].getAttribute('fill')).toBe('none');
    expect(group(doc, '95 % confidence band')[0].querySelector('path')).not.toBeNull();
    expect(group(doc, '95 % prediction band')[0].querySelector('path')).not.toBeNull();
    expect(group(doc, 'extrapolated region')[0].querySelectorAll('rect').length).toBe(2);
    expect(svg).not.toMatch(/NaN|Infinity|undefined/);
  });

  test('in US units labels heat in Btu/h: 35 kW ≈ 119,400 Btu/h (DOMAIN.md §1.1: 1 W = 3.412 Btu/h)', () => {
    const us = heatPlot(input, 'us');
    const r = renderPlot(us.options);
    expect(r.svg).toMatch(/Delivered heat \(Btu\/h\)/);
    expect(num(group(r.doc, 'ceiling line')[0].querySelector('line'), 'y1')).toBeCloseTo(r.y(input.ceilingW! * 3.41214), 0);
    expect(r.svg).not.toMatch(/NaN/);
  });
});

describe('heat plot of the exponential fit (DOMAIN.md §1.3: the "false optimum")', () => {
  const input = heatInputFromFit(expInlet, { choice: chooseFlow(expInlet, 20) });
  const fig = heatPlot(input, 'si');
  const { doc, x } = renderPlot(fig.options);

  test('marks the optimum inside the tested flows near Q* = 1/k ≈ 14.1 L/min and warns it is an artefact', () => {
    expect(input.optimum!.flowM3PerS / LPM).toBeCloseTo(1 / (expInlet.params.k.value * LPM), 1);
    expect(input.optimum!.flowM3PerS / LPM).toBeGreaterThan(13.5);
    expect(input.optimum!.flowM3PerS / LPM).toBeLessThan(14.7);
    const mark = group(doc, 'optimum')[0].querySelector('path');
    const tx = Number(/translate\(([-\d.]+)/.exec(mark?.getAttribute('transform') ?? '')?.[1]);
    expect(tx).toBeCloseTo(x(input.optimum!.flowM3PerS / LPM), 1);
    expect(fig.summary).toMatch(/always has such a maximum/);
  });
});

test('an optimum outside the tested flows is not drawn (DOMAIN.md §1.3 product implication)', () => {
  const base = heatInputFromFit(expInlet);
  const outside: HeatPlotInput = { ...base, optimum: { flowM3PerS: 30 * LPM, heatW: 20000 }, optimumNote: 'outside' };
  const { doc } = renderPlot(heatPlot(outside, 'si').options);
  expect(group(doc, 'optimum').length).toBe(0);
});

test('flows too low to keep the outlet below boiling are shaded red (DOMAIN.md §1.6)', () => {
  const base = heatInputFromFit(coil);
  const input: HeatPlotInput = { ...base, unsafeBelow: [{ flowM3PerS: 3 * LPM, label: 'outlet may boil below this flow' }] };
  const fig = heatPlot(input, 'si');
  const { doc, x } = renderPlot(fig.options);
  const rect = group(doc, 'unsafe flows')[0].querySelector('rect');
  expect(num(rect, 'x') + num(rect, 'width')).toBeCloseTo(x(3), 0);
  expect(fig.summary).toMatch(/Below 3\.00 L\/min the outlet may boil \(shaded red\)/);
});
