import { createElement } from 'react';
import { renderToString } from 'react-dom/server';
import { expect, test } from 'vitest';
import { PlotFigure } from '../../../app/_components/plot-figure';

test('PlotFigure shows the server SVG, a figcaption with the summary and an SVG download link', () => {
  const svg = '<svg xmlns="http://www.w3.org/2000/svg" role="img" aria-label="t"><circle r="2"></circle></svg>';
  const html = renderToString(createElement(PlotFigure, { svg, summary: 'Fourteen trials & a curve.', title: 'Outlet against flow', filename: 'fit-curve' }));
  expect(html).toContain('<circle r="2"></circle>');
  expect(html).toMatch(/<figcaption[^>]*>.*Outlet against flow.*Fourteen trials &amp; a curve\./);
  expect(html).toContain('download="fit-curve.svg"');
  expect(html).toContain(`href="data:image/svg+xml;charset=utf-8,${encodeURIComponent(svg).replace(/&/g, '&amp;')}"`);
  expect(html).toContain('Download SVG');
});
