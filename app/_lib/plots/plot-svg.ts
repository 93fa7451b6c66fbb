// No `server-only` here: the analysis worker threads render plots too (app/_lib/analysis-worker).
import * as Plot from '@observablehq/plot';
import { parseHTML } from 'linkedom';
import { accessiblePlot } from '@/app/_contracts/plot-a11y';

/** Attributes that hold positions and sizes in CSS pixels. */
const GEOMETRY = ['d', 'x', 'y', 'x1', 'x2', 'y1', 'y2', 'cx', 'cy', 'r', 'width', 'height', 'transform', 'points'];
/** a decimal number that is not followed by a unit ("0.32em" stays as written) */
const DECIMAL = /-?\d*\.\d+(?:e-?\d+)?(?![\d.a-z%])/gi;

/**
 * Rounds the geometry of a rendered plot to 0.1 px. Plot writes coordinates with up to 16 digits
 * (path data with 3 decimals); a tenth of a pixel is below what any screen or a 2× PNG shows, and
 * a long line's path gets about a quarter shorter. Text (labels, tooltips, ARIA) is left alone.
 */
function roundGeometry(root: Element): void {
  for (const el of [root, ...root.querySelectorAll('*')]) {
    for (const name of GEOMETRY) {
      const v = el.getAttribute(name);
      if (v && v.includes('.')) el.setAttribute(name, v.replace(DECIMAL, (m) => String(Math.round(Number(m) * 10) / 10)));
    }
  }
}

/**
 * Renders an Observable Plot to an SVG string on the server (first paint without JavaScript,
 * and the source of SVG/PNG exports). linkedom supplies the DOM that Plot draws into; the result
 * is one accessible image (`accessiblePlot`: role img, title and desc, no ARIA on inner groups).
 */
export function plotToSvg(options: Plot.PlotOptions): string {
  const { document } = parseHTML('<!doctype html><html><body></body></html>');
  const el = Plot.plot({ ...options, document: document as unknown as Document });
  roundGeometry(el);
  accessiblePlot(el);
  return (el as unknown as { outerHTML: string }).outerHTML;
}
