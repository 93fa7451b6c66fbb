import { describe, expect, test } from 'vitest';
import { fitCurveInputFromFits, fitCurvePlot } from '../../../app/_lib/plots';
import { coilTrials, fitOrThrow, group, LPM, num, renderPlot } from './support';

const coil = fitOrThrow('coil');
const expInlet = fitOrThrow('exp-inlet');
const excluded = [{ flowM3PerS: 11 * LPM, outletTempC: 60, label: 'trial 15' }];
const input = fitCurveInputFromFits([{ label: 'coil', fit: coil }, { label: 'exp-inlet', fit: expInlet }], { excluded });
const GPM_IN_LPM = 3.785411784; // NIST SP 811 App. B.8: 1 US gal = 231 in³ = 3.785411784 L exactly

describe('fitCurvePlot in SI', () => {
  const fig = fitCurvePlot(input, 'si');
  const { svg, doc, x, y } = renderPlot(fig.options);

  test('draws every fitted trial filled and the excluded one hollow (issue 7: excluded points hollow)', () => {
    expect(group(doc, 'trials')[0].querySelectorAll('circle').length).toBe(coilTrials().x.length);
    const hollow = group(doc, 'excluded trials')[0];
    expect(hollow.querySelectorAll('circle').length).toBe(1);
    expect(hollow.getAttribute('fill')).toBe('none');
    expect(hollow.querySelector('title')?.textContent).toMatch(/trial 15: .*excluded from the fit/);
  });

  test('draws the primary model’s confidence and prediction bands, the prediction band the wider (common practice: PI ⊇ CI)', () => {
    expect(group(doc, '95 % confidence band')[0].querySelector('path')?.getAttribute('d')).toMatch(/^M/);
    expect(group(doc, '95 % prediction band')[0].querySelector('path')?.getAttribute('d')).toMatch(/^M/);
    for (const p of input.models[0].points) {
      expect(p.piLow).toBeLessThanOrEqual(p.ciLow);
      expect(p.piHigh).toBeGreaterThanOrEqual(p.ciHigh);
    }
  });

  test('overlays one curve per model with distinct dash patterns', () => {
    const a = group(doc, 'model coil')[0];
    const b = group(doc, 'model exp-inlet')[0];
    expect(a.querySelector('path')).not.toBeNull();
    expect(b.querySelector('path')).not.toBeNull();
    expect(a.getAttribute('stroke-dasharray')).toBeNull();
    expect(b.getAttribute('stroke-dasharray')).toBe('7 4');
  });

  test('shades the flows outside the tested 2–20 L/min as extrapolated (DOMAIN.md §7 item 3)', () => {
    const rects = [...group(doc, 'extrapolated region')[0].querySelectorAll('rect')];
    expect(rects.length).toBe(2);
    const above = rects.find((r) => Math.abs(num(r, 'x') - x(20)) < 0.5);
    expect(above).toBeDefined();
    expect(num(rects.find((r) => r !== above), 'x') + num(rects.find((r) => r !== above), 'width')).toBeCloseTo(x(2), 0);
    expect(fig.summary).toMatch(/extrapolated/);
  });

  test('marks the replicate pair at 8 L/min with its mean and ± SD bar (DOMAIN.md §2.3)', () => {
    const g = coil.replicates.find((r) => r.n === 2);
    expect(g).toBeDefined();
    const bar = group(doc, 'replicate error bars')[0].querySelector('line');
    expect(num(bar, 'x1')).toBeCloseTo(x((g!.xMean) / LPM), 1);
    expect(Math.abs(num(bar, 'y1') - num(bar, 'y2'))).toBeCloseTo(Math.abs(y(g!.yMean + g!.ySD!) - y(g!.yMean - g!.ySD!)), 1);
    expect(group(doc, 'replicate means')[0].querySelectorAll('path, circle').length).toBe(1);
  });

  test('draws the inlet, scald (49 °C), burn-in-seconds (60 °C) and boiling (100 °C) lines (DOMAIN.md §5 product rule)', () => {
    for (const [kind, c] of [['inlet', 20], ['scald', 49], ['scald-seconds', 60], ['boiling', 100]] as const) {
      const line = group(doc, `${kind} line`)[0]?.querySelector('line');
      expect(line, kind).toBeDefined();
      expect(num(line, 'y1')).toBeCloseTo(y(c), 1);
    }
    expect(fig.summary).toMatch(/boiling at 100 °C/);
  });

  test('has a title, an aria-label and a summary, and no NaN anywhere', () => {
    expect(fig.title).toMatch(/Outlet temperature against flow/);
    expect(doc.querySelector('svg')?.getAttribute('aria-label')).toBe(fig.title);
    expect(doc.querySelector('svg')?.getAttribute('aria-description')).toBe(fig.summary);
    expect(svg).not.toMatch(/NaN|Infinity|undefined/);
  });
});

describe('fitCurvePlot in US units', () => {
  const fig = fitCurvePlot(input, 'us');
  const { svg, doc, x, y } = renderPlot(fig.options);

  test('labels the axes in gpm and °F', () => {
    expect(svg).toMatch(/Flow \(gpm\)/);
    expect(svg).toMatch(/Outlet temperature \(°F\)/);
  });

  test('draws the 20 °C inlet rule at 68 °F and boiling at 212 °F (NIST SP 811: °F = 1.8·°C + 32, exact)', () => {
    expect(num(group(doc, 'inlet line')[0].querySelector('line'), 'y1')).toBeCloseTo(y(68), 6);
    expect(group(doc, 'inlet label')[0].textContent).toBe('inlet 68.0 °F');
    expect(num(group(doc, 'boiling line')[0].querySelector('line'), 'y1')).toBeCloseTo(y(212), 6);
    expect(group(doc, 'scald label')[0].textContent).toMatch(/120 °F/); // 49 °C = 120.2 °F
  });

  test('places the tested range end at 20 L/min = 5.2834 gpm (NIST SP 811: 1 gal = 3.785411784 L)', () => {
    const rects = [...group(doc, 'extrapolated region')[0].querySelectorAll('rect')];
    expect(rects.some((r) => Math.abs(num(r, 'x') - x(20 / GPM_IN_LPM)) < 0.5)).toBe(true);
    expect(fig.summary).toMatch(/5\.28 gpm/);
  });

  test('contains no NaN', () => {
    expect(svg).not.toMatch(/NaN|Infinity|undefined/);
  });
});

test('fitCurveInputFromFits refuses an empty list of fits', () => {
  expect(() => fitCurveInputFromFits([])).toThrow(RangeError);
});
