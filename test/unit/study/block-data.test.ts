/**
 * A fit block over more trials than the display limit (issue 7: anything plotted with more than
 * 2,000 points is reduced with LTTB on the server). Trials from the constant-source coil of
 * DOMAIN.md §1.2 (Ts 90 °C, Tin 20 °C, UA 500 W/K) with seeded noise and one outlier.
 */
import { describe, expect, test } from 'vitest';
import { fitModel, type FitSuccess } from '../../../analysis/fit';
import { fitBlockFigure, fitView } from '../../../app/_lib/fits/fit-compute';
import { parseStoredFit, storedFitResult } from '../../../app/_lib/fits/stored-fit';
import { coilOutletC, LPM, seededNormals } from '../plots/support';

const n = 3000;
const z = seededNormals(3, n);
const x = Array.from({ length: n }, (_, i) => (2 + (16 * i) / (n - 1)) * LPM);
const y = x.map((q, i) => coilOutletC(q) + 0.3 * z[i]);
y[1234] += 45; // one trial far above the curve (about 105 °C where the curve gives 60 °C), the highest outlet of all
const fit = fitModel({ x, y, model: 'coil', covariates: { Tin: x.map(() => 20), rho: x.map(() => 1000), cp: x.map(() => 4186) } }) as FitSuccess;

describe('fit block over 3,000 trials', () => {
  // the result as saveFit stores it (one schema: app/_lib/fits/stored-fit.ts)
  const trials = x.map((q, i) => ({ id: `t${i}`, startedAt: new Date(Date.UTC(2026, 5, 1) + i * 60_000), flowM3PerS: q, inletTempC: 20, outletTempC: y[i] }));
  const comparison = { best: 'coil', verdict: 'coil only', ranking: [] };
  const result = JSON.parse(JSON.stringify(storedFitResult(fit, comparison, 20, trials)));
  // what the fit block draws from the stored result (study-blocks.ts; the share view's head is checked in test/app/study-blocks.test.ts)
  const stored = parseStoredFit(result, 'f1');

  test('draws at most 2,000 trial dots, keeps the outlier and says how many were fitted', async () => {
    expect(fit.ok).toBe(true);
    const plot = fitBlockFigure({ fit: stored.fit, label: 'coil', inletTempC: stored.choice.inletTempC, units: 'si' });
    // the server SVG is one accessible image (inner groups carry no ARIA): every circle is a trial dot
    // (no trial is excluded here, and replicate means are drawn as diamonds)
    const count = plot.svg.split('<circle').length - 1;
    expect(count).toBeGreaterThan(500);
    expect(count).toBeLessThanOrEqual(2000);
    // the outlier is kept: the y axis reaches it (the curve and every other trial stay below 90 °C)
    expect(Math.max(...y.filter((_, i) => i !== 1234))).toBeLessThan(90);
    // the only bare numbers drawn are tick labels; the flow axis stops below 25 L/min, so ≥ 100 is on the temperature axis
    expect(Math.max(...[...plot.svg.matchAll(/>(\d+)</g)].map((m) => Number(m[1])))).toBeGreaterThanOrEqual(100);
    expect(plot.summary).toMatch(/^3,000 trials fitted \(2,000 or fewer drawn, reduced for display keeping the extremes\)/);
    expect(fitView(stored.fit, 'coil')).not.toHaveProperty('residuals'); // the block's table carries no per-point arrays
  });
});
