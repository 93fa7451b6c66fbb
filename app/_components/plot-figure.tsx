'use client';

import type { PlotOptions } from '@observablehq/plot';
import { useEffect, useId, useRef, useState } from 'react';

/** Props of {@link PlotFigure}. */
export interface PlotFigureProps {
  /** the plot rendered on the server (plotToSvg), shown at first paint and without JavaScript */
  svg: string;
  /** the figcaption text (the plot function's `summary`) */
  summary: string;
  /** a short title shown before the summary */
  title: string;
  /** name for the downloaded file; `.svg` is added when missing */
  filename: string;
  /**
   * Plot options to re-render in the browser (e.g. after a control changes). Only a client parent
   * can pass these: options hold functions and Mark objects, which cannot cross from a server
   * component. Without them the server SVG is shown as it is.
   */
  options?: PlotOptions;
  className?: string;
}

const SVG_NS = 'http://www.w3.org/2000/svg';

/** A data URL of an SVG document, for the download link. */
function svgDataUrl(svg: string): string {
  return `data:image/svg+xml;charset=utf-8,${encodeURIComponent(svg)}`;
}

/**
 * A figure around a plot: the server-rendered SVG for the first paint, an optional live re-render
 * with Observable Plot in the browser, a figcaption with the summary and a "Download SVG" link.
 */
export function PlotFigure({ svg, summary, title, filename, options, className }: PlotFigureProps) {
  const liveRef = useRef<HTMLDivElement>(null);
  const [liveSvg, setLiveSvg] = useState<string | null>(null);
  const captionId = useId();

  useEffect(() => {
    const host = liveRef.current;
    if (!options || !host) {
      setLiveSvg(null);
      return;
    }
    let cancelled = false;
    let el: Element | null = null;
    // Plot is loaded only when a live render is asked for, so a static figure ships no plotting code.
    import('@observablehq/plot').then((Plot) => {
      if (cancelled) return;
      el = Plot.plot(options);
      const root = el.tagName.toLowerCase() === 'svg' ? el : el.querySelector('svg');
      root?.setAttribute('xmlns', SVG_NS);
      root?.setAttribute('role', 'img');
      host.replaceChildren(el);
      setLiveSvg(el.outerHTML);
    }).catch(() => {
      if (!cancelled) setLiveSvg(null); // keep the server SVG
    });
    return () => {
      cancelled = true;
      el?.remove();
    };
  }, [options]);

  const current = liveSvg ?? svg;
  const download = filename.toLowerCase().endsWith('.svg') ? filename : `${filename}.svg`;
  return (
    <figure className={className ?? 'card p-4'} aria-describedby={captionId}>
      <div
        className="overflow-x-auto [&_svg]:h-auto [&_svg]:max-w-full"
        hidden={liveSvg !== null}
        dangerouslySetInnerHTML={{ __html: svg }}
      />
      <div ref={liveRef} className="overflow-x-auto [&_svg]:h-auto [&_svg]:max-w-full" hidden={liveSvg === null} />
      <figcaption id={captionId} className="mt-2 text-sm text-ink-muted">
        <span className="font-semibold text-ink">{title}.</span> {summary}
      </figcaption>
      <p className="mt-2 print:hidden">
        <a className="btn-quiet" href={svgDataUrl(current)} download={download}>
          Download SVG
        </a>
      </p>
    </figure>
  );
}
