/**
 * Shared data for the plot tests: trials from the constant-source coil of DOMAIN.md §1.2
 * (Ts 90 °C, Tin 20 °C, UA 500 W/K, cp 4186 J/(kg·K), 1 kg/L) at 13 flows from 2 to 20 L/min, with
 * seeded noise (SD 0.3 K, so the bands have width) and a replicate pair at 8 L/min.
 */
import * as Plot from '@observablehq/plot';
import { parseHTML } from 'linkedom';
import { fitModel, type FitSuccess } from '../../../analysis/fit';
import { seededNormals } from '../../support/seeded-normals';

export { seededNormals };

export const LPM = 1 / 60000; // m³/s per L/min

export const coilOutletC = (m3PerS: number) => 90 - (90 - 20) * Math.exp(-500 / (1000 * m3PerS * 4186));

/** 13 flows 2–20 L/min plus a replicate at 8 L/min (14 points), outlet with SD 0.3 K noise. */
export function coilTrials(noiseK = 0.3) {
  const flowsLpm = [...Array.from({ length: 13 }, (_, k) => 2 + 1.5 * k), 8];
  const z = seededNormals(7, flowsLpm.length);
  const x = flowsLpm.map((q) => q * LPM);
  const y = x.map((v, i) => coilOutletC(v) + noiseK * z[i]);
  return { x, y, covariates: { Tin: x.map(() => 20), rho: x.map(() => 1000), cp: x.map(() => 4186) } };
}

export function fitOrThrow(model: string, data = coilTrials()): FitSuccess {
  const f = fitModel({ ...data, model });
  if (!f.ok) throw new Error(`${model} fit failed: ${f.reason}`);
  return f;
}

/** Parses an SVG string for queries. */
export function parseSvg(svg: string) {
  const { document } = parseHTML(`<!doctype html><html><body>${svg}</body></html>`);
  return document;
}

/** The group of marks with this aria-description (the plot functions set one per mark). */
export function group(doc: ReturnType<typeof parseSvg>, description: string) {
  return doc.querySelectorAll(`g[aria-description="${description}"]`);
}

/**
 * Renders Plot options to an SVG string as app/_lib/plots/plot-svg.ts `plotToSvg` does (linkedom
 * document, xmlns and role on the root), but without its rounding of the geometry to 0.1 px, so
 * that the tests read exact positions (test/unit/plots/plot-svg.test.ts checks the rounding). A copy because vitest cannot load that file yet: its
 * `import 'server-only'` goes through the alias `server-only/empty.js`, which the package's
 * `exports` field refuses. Switch to plotToSvg once vitest.config.mts aliases the absolute path.
 */
export function renderSvg(options: Plot.PlotOptions): string {
  const { document } = parseHTML('<!doctype html><html><body></body></html>');
  const el = Plot.plot({ ...options, document: document as unknown as Document });
  const svg = el.tagName.toLowerCase() === 'svg' ? el : el.querySelector('svg');
  if (svg) {
    svg.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
    svg.setAttribute('role', 'img');
  }
  return (el as unknown as { outerHTML: string }).outerHTML;
}

/** Renders like plotToSvg and also returns the parsed SVG and the x and y scales (data → pixels). */
export function renderPlot(options: Plot.PlotOptions) {
  const { document } = parseHTML('<!doctype html><html><body></body></html>');
  const el = Plot.plot({ ...options, document: document as unknown as Document }) as unknown as (SVGSVGElement | HTMLElement) & Plot.Plot;
  const svg = renderSvg(options);
  const x = el.scale('x');
  const y = el.scale('y');
  return { svg, doc: parseSvg(svg), x: (v: number | Date) => (x?.apply(v) as number), y: (v: number | string) => (y?.apply(v) as number) };
}

/** Numeric attribute of an element. */
export const num = (el: Element | null | undefined, name: string) => Number(el?.getAttribute(name));
