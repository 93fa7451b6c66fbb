/**
 * Makes a rendered Observable Plot one accessible image, on the server (plotToSvg, linkedom) and in
 * the browser (PlotFigure's live render) alike. Plot writes `aria-label` on its axis and mark
 * groups and `aria-description` on marks and on the root: ARIA forbids naming a plain `<g>`
 * (WAI-ARIA 1.2 §5.2.8.6, names prohibited on generic and presentational elements), and
 * `aria-description` is not in ARIA 1.2, so axe reports both. Per SVG-AAM (the `img` role, whose
 * children are presentational) the root becomes `role="img"` named by its `aria-label` and a
 * `<title>`, described by a `<desc>`; the inner groups lose their ARIA attributes. An inner
 * `<svg>` without a name (a legend swatch) is hidden from assistive technology.
 */
const SVG_NS = 'http://www.w3.org/2000/svg';

export function accessiblePlot(root: Element): void {
  const svgs = root.tagName.toLowerCase() === 'svg' ? [root] : [...root.querySelectorAll('svg')];
  for (const svg of svgs) {
    const doc = svg.ownerDocument;
    svg.setAttribute('xmlns', SVG_NS);
    for (const el of svg.querySelectorAll('[aria-label], [aria-description]')) {
      el.removeAttribute('aria-label');
      el.removeAttribute('aria-description');
    }
    const label = svg.getAttribute('aria-label');
    const description = svg.getAttribute('aria-description');
    svg.removeAttribute('aria-description');
    if (!label) {
      svg.setAttribute('aria-hidden', 'true');
      continue;
    }
    svg.setAttribute('role', 'img');
    if (description) {
      const desc = doc.createElementNS(SVG_NS, 'desc');
      desc.textContent = description;
      svg.insertBefore(desc, svg.firstChild);
    }
    const title = doc.createElementNS(SVG_NS, 'title');
    title.textContent = label;
    svg.insertBefore(title, svg.firstChild);
  }
}
