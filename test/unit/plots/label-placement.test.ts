/**
 * Label placement (app/_plots/label-placement.ts) and the fit plot's labels as drawn: no two
 * label boxes overlap, and no label (a model's or a reference line's) covers a trial, at a desktop
 * and at a phone's width.
 * Boxes are measured with the same estimate as the placement (0.6 em a glyph, 1.2 em a line:
 * common practice for a proportional sans-serif), from the positions Plot wrote into the SVG.
 */
import { describe, expect, test } from 'vitest';
import { overlapArea, placeLabels, textBox, type Box } from '../../../app/_plots/label-placement';
import { fitCurvePlot } from '../../../app/_plots/fit-curve';
import { fitCurveInputFromFits } from '../../../app/_lib/plots/adapters';
import { coilTrials, fitOrThrow, LPM, parseSvg, renderSvg } from './support';

const frame: Box = { x: 0, y: 0, width: 640, height: 360 };

describe('placeLabels', () => {
  test('gives each label its first free candidate; a later label moves off an earlier one', () => {
    const same = [{ cx: 100, cy: 100 }, { cx: 100, cy: 130 }];
    const [a, b] = placeLabels([{ text: 'coil', candidates: same }, { text: 'exp-inlet', candidates: same }], [], frame);
    expect([a.cx, a.cy, a.free]).toEqual([100, 100, true]);
    expect([b.cx, b.cy, b.free]).toEqual([100, 130, true]);
    expect(overlapArea(a.box, b.box)).toBe(0);
  });

  test('steps around obstacles and keeps labels inside the frame', () => {
    const dot: Box = { x: 95, y: 95, width: 10, height: 10 };
    const [p] = placeLabels([{ text: 'coil', candidates: [{ cx: 100, cy: 100 }, { cx: 5, cy: 200 }, { cx: 100, cy: 200 }] }], [dot], frame);
    expect([p.cx, p.cy, p.free]).toEqual([100, 200, true]);
  });

  test('when no candidate is free, takes the one that overlaps least', () => {
    const wall: Box = { x: 0, y: 0, width: 640, height: 110 };
    const [p] = placeLabels([{ text: 'coil', candidates: [{ cx: 300, cy: 50 }, { cx: 300, cy: 108 }] }], [wall], frame);
    expect(p.free).toBe(false);
    expect(p.cy).toBe(108);
  });
});

/** The boxes of the texts of the groups whose aria-description ends in "label" or "labels". */
function labelBoxes(svg: string) {
  const doc = parseSvg(svg);
  const translate = (el: Element | null) => {
    const m = /translate\(([-\d.e]+),([-\d.e]+)\)/.exec(el?.getAttribute('transform') ?? '');
    return m ? [Number(m[1]), Number(m[2])] : [0, 0];
  };
  const out: { text: string; group: string; box: Box }[] = [];
  for (const g of doc.querySelectorAll('g[aria-description]')) {
    const group = g.getAttribute('aria-description') ?? '';
    if (!/labels?$/.test(group)) continue;
    const [gx, gy] = translate(g);
    for (const t of g.querySelectorAll('text')) {
      const [tx, ty] = translate(t);
      const text = t.textContent ?? '';
      const w = textBox(text, 0, 0).width;
      const anchor = t.getAttribute('text-anchor') ?? g.getAttribute('text-anchor') ?? 'middle';
      const cx = gx + tx + (anchor === 'start' ? w / 2 : anchor === 'end' ? -w / 2 : 0);
      out.push({ text, group, box: textBox(text, cx, gy + ty) });
    }
  }
  return { doc, labels: out };
}

describe('fit plot labels', () => {
  const coil = fitOrThrow('coil');
  const expInlet = fitOrThrow('exp-inlet');
  const power = fitOrThrow('power');
  const excluded = [{ flowM3PerS: 11 * LPM, outletTempC: 60, label: 'trial 15' }];
  const input = fitCurveInputFromFits([{ label: 'coil', fit: coil }, { label: 'exp-inlet', fit: expInlet }, { label: 'power', fit: power }], { excluded });

  test.each([
    ['a desktop', 'si', { width: 640, height: 360 }],
    ['a desktop, US units', 'us', { width: 640, height: 360 }],
    ['a phone (360 px)', 'si', { width: 340, height: 300 }],
    ['a phone (360 px), US units', 'us', { width: 340, height: 300 }],
  ] as const)('on %s no label box overlaps another or covers a trial', (_, units, size) => {
    const { doc, labels } = labelBoxes(renderSvg(fitCurvePlot(input, units, size).options));
    const models = labels.filter((l) => l.group === 'model labels');
    expect(models.map((l) => l.text).sort()).toEqual(['coil', 'exp-inlet', 'power']);
    expect(labels.filter((l) => l.group !== 'model labels').length).toBeGreaterThanOrEqual(3); // inlet and safety lines
    for (let i = 0; i < labels.length; i++) {
      for (let j = i + 1; j < labels.length; j++) {
        expect(overlapArea(labels[i].box, labels[j].box), `${labels[i].text} / ${labels[j].text}`).toBe(0);
      }
    }
    const dots = [...doc.querySelectorAll('g[aria-description="trials"] circle, g[aria-description="excluded trials"] circle')];
    expect(dots.length).toBe(coilTrials().x.length + 1);
    for (const m of labels) {
      for (const c of dots) {
        const [cx, cy] = [Number(c.getAttribute('cx')), Number(c.getAttribute('cy'))];
        expect(overlapArea(m.box, { x: cx - 4, y: cy - 4, width: 8, height: 8 }), `${m.text} over the trial at ${cx}, ${cy}`).toBe(0);
      }
    }
  });
});
