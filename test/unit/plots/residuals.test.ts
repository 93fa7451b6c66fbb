import { describe, expect, test } from 'vitest';
import { residualInputFromFit, residualPlots } from '../../../app/_lib/plots';
import { normalQuantile } from '../../../analysis/stats/distributions';
import { coilTrials, fitOrThrow, group, num, renderPlot } from './support';

const data = coilTrials();
const coil = fitOrThrow('coil', data);
const expInlet = fitOrThrow('exp-inlet', data);

describe('residual plots of the coil fit', () => {
  const input = residualInputFromFit(coil);
  const figs = residualPlots(input, 'si');

  test.each(['vsFlow', 'vsFitted', 'vsOrder', 'qq'] as const)('%s draws one point per fitted trial, a title and no NaN', (k) => {
    const { svg, doc } = renderPlot(figs[k].options);
    expect(group(doc, 'residuals')[0].querySelectorAll('circle').length).toBe(data.x.length);
    expect(doc.querySelector('svg')?.getAttribute('aria-label')).toBe(figs[k].title);
    expect(svg).not.toMatch(/NaN|Infinity|undefined/);
  });

  test.each(['vsFlow', 'vsFitted', 'vsOrder'] as const)('%s has a zero rule at residual 0', (k) => {
    const { doc, y } = renderPlot(figs[k].options);
    expect(num(group(doc, 'zero line')[0].querySelector('line'), 'y1')).toBeCloseTo(y(0), 6);
  });

  test('rings and titles every flagged point: h > 2p/n, Cook’s D > 4/n (DOMAIN.md §7 item 2, Belsley–Kuh–Welsch; common practice)', () => {
    const flagged = new Set([...coil.flags.highLeverage, ...coil.flags.influential, ...coil.flags.outliers]);
    expect(flagged.size).toBeGreaterThan(0); // the 2 L/min point carries the information about Ts
    const { doc } = renderPlot(figs.vsFlow.options);
    const rings = group(doc, 'flagged points')[0];
    expect(rings.querySelectorAll('circle').length).toBe(flagged.size);
    expect(rings.querySelector('title')?.textContent).toMatch(/trial 1: high leverage \(h = [\d.]+ > 2p\/n = 0\.29\)/);
    expect(figs.vsFlow.summary).toMatch(/flagged/);
  });

  test('finds no pattern in the residual signs of the right model (runs test, NIST/SEMATECH §1.3.5.13)', () => {
    expect(input.runs?.pValue).toBeGreaterThan(0.05);
    expect(figs.vsFlow.summary).toMatch(/no pattern detected/);
  });

  test('plots the Q–Q points at Blom’s normal quantiles Φ⁻¹((i − 3/8)/(n + 1/4)) (Blom 1958; common practice)', () => {
    const { doc, x, y } = renderPlot(figs.qq.options);
    const cx = [...group(doc, 'residuals')[0].querySelectorAll('circle')].map((c) => num(c, 'cx')).sort((a, b) => a - b);
    const n = data.x.length;
    expect(cx[0]).toBeCloseTo(x(normalQuantile(0.625 / (n + 0.25))), 1);
    expect(cx[n - 1]).toBeCloseTo(x(normalQuantile((n - 0.375) / (n + 0.25))), 1);
    const std = coil.standardizedResiduals.filter((v): v is number => v !== null).sort((a, b) => a - b);
    const cy = [...group(doc, 'residuals')[0].querySelectorAll('circle')].map((c) => num(c, 'cy')).sort((a, b) => b - a);
    expect(cy[0]).toBeCloseTo(y(std[0]), 1);
    expect(group(doc, 'reference line y = x')[0].querySelector('path')).not.toBeNull();
  });

  test('uses clock time for the order plot when every trial has a time', () => {
    const times = data.x.map((_, i) => new Date(Date.UTC(2026, 5, 1, 9, 10 * i)));
    const f = residualPlots(residualInputFromFit(coil, { times }), 'si').vsOrder;
    expect(f.title).toMatch(/against time/);
    const { svg } = renderPlot(f.options);
    expect(svg).toMatch(/Time →/);
    expect(svg).not.toMatch(/NaN/);
  });

  test('refuses labels of the wrong length', () => {
    expect(() => residualInputFromFit(coil, { labels: ['a'] })).toThrow(RangeError);
  });
});

describe('residual plots of the exponential fit on coil data (DOMAIN.md §1.3: systematic residuals up to 2.6 K)', () => {
  const input = residualInputFromFit(expInlet);
  const figs = residualPlots(input, 'si');

  test('say the residuals are patterned (too few runs of sign along the flow)', () => {
    expect(input.runs?.pValue).toBeLessThan(0.05);
    expect(figs.vsFlow.summary).toMatch(/a pattern, so the model's shape does not match the data/);
  });

  test('show the largest residual near 2.6 K', () => {
    expect(Math.max(...input.points.map((p) => Math.abs(p.residualK)))).toBeGreaterThan(2.2);
    expect(figs.vsFlow.summary).toMatch(/largest residual 2\.\d K/);
  });
});

describe('an outlying trial', () => {
  const bumped = coilTrials();
  bumped.y[6] += 3; // 11 L/min trial read 3 K high
  const fit = fitOrThrow('coil', bumped);
  const figs = residualPlots(residualInputFromFit(fit), 'si');

  test('is flagged for |studentized residual| > 3, ringed, coded O and titled (DOMAIN.md §7; common practice)', () => {
    expect(fit.flags.outliers).toContain(6);
    const { doc } = renderPlot(figs.vsFitted.options);
    const titles = [...group(doc, 'flagged points')[0].querySelectorAll('title')].map((t) => t.textContent ?? '');
    expect(titles.some((t) => /^trial 7: .*outlier \(\|studentized residual\| = [\d.]+ > 3\)/.test(t))).toBe(true);
    expect([...group(doc, 'flag labels')[0].querySelectorAll('text')].some((t) => /O/.test(t.textContent ?? ''))).toBe(true);
  });
});

describe('residual plots in US units', () => {
  const figs = residualPlots(residualInputFromFit(expInlet), 'us');

  test('draw residuals as °F intervals: r K → 1.8·r °F (NIST SP 811 B.9: 1 K = 1.8 °F interval)', () => {
    const { svg, doc, y } = renderPlot(figs.vsFlow.options);
    expect(svg).toMatch(/Residual \(°F\)/);
    expect(svg).toMatch(/Flow \(gpm\)/);
    const r = expInlet.residuals[0];
    const cy = [...group(doc, 'residuals')[0].querySelectorAll('circle')].map((c) => num(c, 'cy'));
    expect(cy.some((v) => Math.abs(v - y(1.8 * r)) < 0.01)).toBe(true);
  });

  test('draw the fitted-value axis in °F', () => {
    expect(renderPlot(figs.vsFitted.options).svg).toMatch(/Fitted outlet temperature \(°F\)/);
  });
});
