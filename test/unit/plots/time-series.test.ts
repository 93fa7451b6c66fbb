import { describe, expect, test } from 'vitest';
import { timeSeriesSegmentsPlot } from '../../../app/_lib/plots/time-series';
import { group, num, renderPlot } from './support';

// An invented 1 h log at one sample per 6 s: three flow steps, one missing outlet reading.
const points = Array.from({ length: 600 }, (_, i) => ({
  tS: i * 6,
  inletC: 20 + 0.01 * i,
  outletC: i === 100 ? null : i < 200 ? 60 : i < 400 ? 45 : 38,
  flowM3PerS: (i < 200 ? 4 : i < 400 ? 8 : 12) / 60000,
}));
const segments = [{ startS: 300, endS: 1150 }, { startS: 1500, endS: 2350 }, { startS: 2700, endS: 3500 }];

describe('timeSeriesSegmentsPlot', () => {
  const figs = timeSeriesSegmentsPlot({ points, segments }, 'si');

  test.each(['temperatures', 'flow'] as const)('%s panel shades and numbers the three steady segments', (k) => {
    const { svg, doc, x } = renderPlot(figs[k].options);
    const rects = [...group(doc, 'steady segments')[0].querySelectorAll('rect')];
    expect(rects.length).toBe(3);
    expect(num(rects[1], 'x')).toBeCloseTo(x(25), 1); // 1500 s = 25 min
    expect([...group(doc, 'segment numbers')[0].querySelectorAll('text')].map((t) => t.textContent)).toEqual(['1', '2', '3']);
    expect(svg).not.toMatch(/NaN|Infinity|undefined/);
  });

  test('draws inlet and outlet lines and leaves a gap at a missing reading', () => {
    const { doc } = renderPlot(figs.temperatures.options);
    expect(group(doc, 'inlet')[0].querySelector('path')).not.toBeNull();
    const d = group(doc, 'outlet')[0].querySelector('path')?.getAttribute('d') ?? '';
    expect(d.split('M').filter(Boolean).length).toBe(2);
  });

  test('shows flow in gpm in US units: 4 L/min = 1.0567 gpm (NIST SP 811: 1 gal = 3.785411784 L)', () => {
    const us = timeSeriesSegmentsPlot({ points, segments }, 'us');
    expect(us.flow.summary).toMatch(/1\.06–3\.17 gpm/);
    expect(renderPlot(us.flow.options).svg).toMatch(/Flow \(gpm\)/);
  });

  test('uses clock time when the log start is given', () => {
    const f = timeSeriesSegmentsPlot({ points, segments, origin: new Date(Date.UTC(2026, 5, 1, 9)) }, 'si');
    const { svg } = renderPlot(f.temperatures.options);
    expect(svg).toMatch(/Time \(UTC\)/);
    expect(svg).not.toMatch(/NaN/);
  });
});
