import { createElement } from 'react';
import { renderToString } from 'react-dom/server';
import { expect, test } from 'vitest';
import { PlotFigure } from '../../../app/_components/plot-figure';

test('PlotFigure shows the server SVG once, a figcaption with the summary and SVG and PNG download buttons', () => {
  const svg = '<svg xmlns="http://www.w3.org/2000/svg" role="img" aria-label="t"><circle r="2"></circle></svg>';
  const html = renderToString(createElement(PlotFigure, { svg, summary: 'Fourteen trials & a curve.', title: 'Outlet against flow', filename: 'fit-curve' }));
  expect(html).toContain('<circle r="2"></circle>');
  expect(html).toMatch(/<figcaption[^>]*>.*Outlet against flow.*Fourteen trials &amp; a curve\./);
  expect(html).toMatch(/<button type="button"[^>]*>Download SVG<\/button>/);
  expect(html).toMatch(/<button type="button"[^>]*>Download PNG<\/button>/);
  // the files are made on click (test/e2e/study-blocks.test.ts downloads both): the page carries the SVG once
  expect(html.split('<circle r="2">').length - 1).toBe(1);
  expect(html).not.toContain('data:image/svg+xml');
});
