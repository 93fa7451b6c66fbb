import 'server-only';
import * as Plot from '@observablehq/plot';
import { parseHTML } from 'linkedom';

/**
 * Renders an Observable Plot to an SVG string on the server (first paint without JavaScript,
 * and the source of SVG/PNG exports). linkedom supplies the DOM that Plot draws into.
 */
export function plotToSvg(options: Plot.PlotOptions): string {
  const { document } = parseHTML('<!doctype html><html><body></body></html>');
  const el = Plot.plot({ ...options, document: document as unknown as Document });
  const svg = el.tagName.toLowerCase() === 'svg' ? el : el.querySelector('svg');
  if (svg) {
    svg.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
    svg.setAttribute('role', 'img');
  }
  return (el as unknown as { outerHTML: string }).outerHTML;
}
