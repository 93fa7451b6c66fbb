/**
 * A fit block over more trials than the display limit (issue 7: anything plotted with more than
 * 2,000 points is reduced with LTTB on the server). Trials from the constant-source coil of
 * DOMAIN.md §1.2 (Ts 90 °C, Tin 20 °C, UA 500 W/K) with seeded noise and one outlier.
 */
import { describe, expect, test } from 'vitest';
import { fitModel, type FitSuccess } from '../../../analysis/fit';
import { blockData, type BlockContext } from '../../../app/_lib/studies/study-blocks';
import { storedFitResult } from '../../../app/_lib/fits/stored-fit';
import type { FitRow } from '../../../entities';
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
  const row = { id: 'f1', title: 'big fit', version: 1, model: 'coil', reviewState: 'draft', result } as unknown as FitRow;
  const ctx = { units: 'si', publicView: true, fits: new Map([['f1', row]]) } as unknown as BlockContext;

  test('draws at most 2,000 trial dots, keeps the outlier and says how many were fitted', async () => {
    expect(fit.ok).toBe(true);
    const b = await blockData(ctx, { id: 'b', kind: 'fit', data: { fitId: 'f1' } });
    if (b.body.type !== 'fit') throw new Error(b.body.type);
    const dots = b.body.plot.svg.split('aria-description="trials"')[1].split('</g>')[0];
    const count = dots.split('<circle').length - 1;
    expect(count).toBeGreaterThan(500);
    expect(count).toBeLessThanOrEqual(2000);
    // the outlier is kept: the y axis reaches it (the curve and every other trial stay below 90 °C)
    expect(Math.max(...y.filter((_, i) => i !== 1234))).toBeLessThan(90);
    const ticks = b.body.plot.svg.split('aria-label="y-axis tick label"')[1].split('</g>')[0];
    expect(Math.max(...[...ticks.matchAll(/>(\d+)</g)].map((m) => Number(m[1])))).toBeGreaterThanOrEqual(100);
    expect(b.body.plot.summary).toMatch(/^3,000 trials fitted \(2,000 or fewer drawn, reduced for display keeping the extremes\)/);
    expect(b.body.head.fitId).toBeNull(); // the share view links nowhere into the lab
    expect(b.body.fit).not.toHaveProperty('residuals');
  });
});
