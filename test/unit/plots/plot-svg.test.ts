import * as Plot from '@observablehq/plot';
import { describe, expect, test } from 'vitest';
import { plotToSvg } from '../../../app/_lib/plots/plot-svg';

describe('plotToSvg', () => {
  // A line through fractional positions and a tooltip with a long decimal (our data, common practice).
  const xs = Array.from({ length: 300 }, (_, i) => i / 7);
  const svg = plotToSvg({
    width: 640, height: 300,
    marks: [Plot.lineY(xs, { x: (d: number) => d, y: (d: number) => Math.sin(d) }), Plot.dot([{ x: 1 / 3, y: 0.123456 }], { x: 'x', y: 'y', title: () => 'flow 0.123456 L/s' })],
  });

  test('rounds every coordinate of the geometry to a tenth of a pixel', () => {
    // pixel values only: lengths with a unit (text offsets such as 0.32em) are left as written
    const geometry = [...svg.matchAll(/\s(?:d|x|y|x1|x2|y1|y2|cx|cy|transform)="([^"]*)"/g)].map((m) => m[1]).join(' ').replace(/-?\d*\.\d+[a-z%]+/gi, '');
    expect(geometry).toMatch(/\d\.\d/);
    expect(geometry).not.toMatch(/\d\.\d\d/);
  });

  test('leaves text (tooltips, labels) as written and the SVG well-formed for export', () => {
    expect(svg).toContain('flow 0.123456 L/s');
    expect(svg).toMatch(/^<svg(?=[^>]*\sxmlns="http:\/\/www\.w3\.org\/2000\/svg")(?=[^>]*\srole="img")/);
    expect(svg).toContain('y="0.32em"'); // lengths with a unit are not geometry in pixels
    expect(svg).not.toMatch(/NaN|undefined/);
  });
});
