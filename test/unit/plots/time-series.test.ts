import { describe, expect, test } from 'vitest';
import { timeSeriesSegmentsPlot } from '../../../app/_lib/plots';
import { group, num, renderPlot } from './support';

// An invented 1 h log at one sample per 6 s: three flow steps, one missing outlet reading.
const points = Array.from({ length: 600 }, (_, i) => ({
  tS: i * 6,
  inletTempC: 20 + 0.01 * i,
  outletTempC: i === 100 ? null : i < 200 ? 60 : i < 400 ? 45 : 38,
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

  // DOMAIN.md §5: 60 °C burns in seconds and 49 °C scalds (scald-time table [39]); 40 °C spa limit (CPSC / UL 1563)
  test('an outlet logged at 60 °C gets a line and a caution for each threshold reached, in words', () => {
    expect(figs.temperatures.cautions?.map((c) => `${c.code}@${c.where}`)).toEqual(['scald-seconds@logged outlet', 'scald@logged outlet', 'spa-limit@logged outlet']);
    const { doc } = renderPlot(figs.temperatures.options);
    expect([...group(doc, 'caution label')].map((g) => g.textContent)).toEqual(['burns in seconds 60.0 °C', 'scald risk 49.0 °C', 'spa limit 40.0 °C']);
    expect(figs.temperatures.summary).toMatch(/Caution lines: burns in seconds 60.0 °C; scald risk 49.0 °C; spa limit 40.0 °C\./);
    const cool = timeSeriesSegmentsPlot({ points: points.map((p) => ({ ...p, outletTempC: 30 })), segments }, 'si');
    expect(cool.temperatures.cautions).toEqual([]);
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

describe('timeSeriesSegmentsPlot with the hundreds of segments of a long log', () => {
  // An invented 12-day log drawn from 2,000 points: 800 segments of 1,000 s with 250-s transitions.
  const long = Array.from({ length: 2000 }, (_, i) => ({ tS: i * 500, inletTempC: 15, outletTempC: 40 + (i % 7), flowM3PerS: 2e-4 }));
  const many = Array.from({ length: 800 }, (_, i) => ({ startS: 250 + i * 1250, endS: 1250 + i * 1250 }));
  const figs = timeSeriesSegmentsPlot({ points: long, segments: many }, 'si');

  test('draws segments closer than the plot can show as one band, and numbers none', () => {
    const { doc } = renderPlot(figs.temperatures.options);
    const rects = group(doc, 'steady segments')[0].querySelectorAll('rect');
    expect(rects.length).toBeGreaterThan(0);
    expect(rects.length).toBeLessThan(800); // 250 s gaps are 0.16 px at 640 px for 1e6 s
    expect(group(doc, 'segment numbers')).toHaveLength(0);
  });

  test('summarises them by count and duration instead of naming each', () => {
    expect(figs.temperatures.summary).toMatch(/800 steady segments shaded, 16\.7 to 16\.7 min long; segments closer than the plot can separate are drawn as one band \(1 band in all\)/);
    expect(figs.temperatures.summary.length).toBeLessThan(600);
  });
});
