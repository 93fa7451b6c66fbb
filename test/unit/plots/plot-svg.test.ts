import * as Plot from '@observablehq/plot';
import { parseHTML } from 'linkedom';
import { describe, expect, test } from 'vitest';
import { plotToSvg } from '../../../app/_lib/plots/plot-svg';

describe('plotToSvg', () => {
  // A line through fractional positions and a tooltip with a long decimal (our data, common practice).
  const xs = Array.from({ length: 300 }, (_, i) => i / 7);
  const svg = plotToSvg({
    width: 640, height: 300, ariaLabel: 'A sine', ariaDescription: 'One period and a bit, with a dot at a third.',
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

  // WAI-ARIA 1.2 §5.2.8.6 (no names on generic or presentational elements) and SVG-AAM (role img,
  // <title> and <desc>): what axe-core's aria-prohibited-attr and svg-img-alt rules check.
  test('is one image named by its title and described by its desc, with no ARIA on the inner groups', () => {
    const doc = parseHTML(`<!doctype html><html><body>${svg}</body></html>`).document;
    const root = doc.querySelector('svg')!;
    expect(root.getAttribute('role')).toBe('img');
    expect(root.getAttribute('aria-label')).toBe('A sine');
    expect(root.hasAttribute('aria-description')).toBe(false);
    expect(root.firstElementChild?.tagName.toLowerCase()).toBe('title');
    expect(root.querySelector(':scope > title')?.textContent).toBe('A sine');
    expect(root.querySelector(':scope > desc')?.textContent).toBe('One period and a bit, with a dot at a third.');
    expect(root.querySelectorAll('[aria-label], [aria-description]').length).toBe(0);
    // Plot wrote ARIA on its groups before (the axes, the marks): there were some to remove
    const raw = Plot.plot({ width: 640, height: 300, ariaLabel: 'A sine', marks: [Plot.lineY([1, 2])], document: parseHTML('<!doctype html><html><body></body></html>').document as unknown as Document });
    expect((raw as unknown as Element).querySelectorAll('g[aria-label]').length).toBeGreaterThan(0);
  });

  test('hides a plot that has no name from assistive technology instead of showing an unnamed image', () => {
    const bare = plotToSvg({ width: 200, height: 100, marks: [Plot.lineY([1, 2, 3])] });
    expect(bare).toMatch(/^<svg[^>]*\saria-hidden="true"/);
    expect(bare).not.toMatch(/role="img"/);
  });
});
