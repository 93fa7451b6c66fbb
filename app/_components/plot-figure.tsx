'use client';

import type { PlotOptions } from '@observablehq/plot';
import { useEffect, useId, useRef, useState } from 'react';
import type { CautionLike } from '@/analysis/safety/cautions';
import { accessiblePlot } from '@/app/_contracts/plot-a11y';
import { CautionList } from './safety-notice';

/** Props of {@link PlotFigure}. */
export interface PlotFigureProps {
  /**
   * the plot rendered on the server (plotToSvg), shown at first paint and without JavaScript;
   * absent when the browser draws it from `options` (the fit and forecast pages)
   */
  svg?: string;
  /** the figcaption text (the plot function's `summary`) */
  summary: string;
  /** a short title shown before the summary */
  title: string;
  /** name for the downloaded files, without extension (`.svg` / `.png` are added) */
  filename: string;
  /**
   * Plot options to re-render in the browser (e.g. after a control changes). Only a client parent
   * can pass these: options hold functions and Mark objects, which cannot cross from a server
   * component. Without them the server SVG is shown as it is.
   */
  options?: PlotOptions;
  className?: string;
  /** the cautions of the temperatures the plot shows, listed under it (one per hazard and place) */
  cautions?: readonly CautionLike[];
}

const SVG_NS = 'http://www.w3.org/2000/svg';

/**
 * PNG of a plot, drawn in the browser: the plot's `<svg>` (the largest one, when Plot wrapped it in
 * a figure with a legend) is loaded as an image and painted on a canvas at `scale` × its size on a
 * white ground. Done here rather than by a headless browser on the server because the SVG is
 * already in the page: a download costs the server nothing, needs no browser per click (on the
 * public share view that would let anyone start one), and works the same for a member and a
 * share-link reader. An SVG drawn as an image cannot load web fonts, so text is
 * set in the browser's sans-serif — the numbers and layout are the plot's own.
 */
export async function svgToPngBlob(markup: string, scale = 2): Promise<Blob> {
  const doc = new DOMParser().parseFromString(`<!doctype html><body>${markup}`, 'text/html');
  const size = (el: Element) => {
    const vb = el.getAttribute('viewBox')?.split(/[\s,]+/).map(Number);
    return { w: Number(el.getAttribute('width')) || vb?.[2] || 640, h: Number(el.getAttribute('height')) || vb?.[3] || 400 };
  };
  const svgs = [...doc.querySelectorAll('svg')].filter((el) => !el.parentElement?.closest('svg'));
  const root = svgs.sort((a, b) => size(b).w * size(b).h - size(a).w * size(a).h)[0];
  if (!root) throw new TypeError('the plot holds no <svg>');
  const { w, h } = size(root);
  root.setAttribute('xmlns', SVG_NS);
  root.setAttribute('width', String(w));
  root.setAttribute('height', String(h));
  const url = URL.createObjectURL(new Blob([new XMLSerializer().serializeToString(root)], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    img.src = url;
    await img.decode();
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(w * scale);
    canvas.height = Math.round(h * scale);
    const ctx = canvas.getContext('2d');
    if (!ctx) throw new Error('this browser cannot draw on a canvas');
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, canvas.width, canvas.height);
    ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
    return await new Promise<Blob>((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('the PNG could not be made'))), 'image/png'));
  } finally {
    URL.revokeObjectURL(url);
  }
}

/** Saves a blob under a file name through a temporary link. */
function saveBlob(blob: Blob, name: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/**
 * A figure around a plot: the server-rendered SVG for the first paint, an optional live re-render
 * with Observable Plot in the browser, a figcaption with the summary, and "Download SVG" and
 * "Download PNG" buttons (both files are made in the browser when clicked).
 */
export function PlotFigure({ svg, summary, title, filename, options, className, cautions }: PlotFigureProps) {
  const liveRef = useRef<HTMLDivElement>(null);
  const [live, setLive] = useState(false);
  const captionId = useId();

  useEffect(() => {
    const host = liveRef.current;
    if (!options || !host) {
      setLive(false);
      return;
    }
    let cancelled = false;
    let el: Element | null = null;
    // Plot is loaded only when a live render is asked for, so a static figure ships no plotting code.
    import('@observablehq/plot').then((Plot) => {
      if (cancelled) return;
      el = Plot.plot(options);
      accessiblePlot(el);
      host.replaceChildren(el);
      setLive(true);
    }).catch(() => {
      if (!cancelled) setLive(false); // keep the server SVG
    });
    return () => {
      cancelled = true;
      el?.remove();
    };
  }, [options]);

  // the markup of what is shown, read when a download is asked for (not at every redraw)
  const current = () => (live && liveRef.current ? liveRef.current.innerHTML : svg ?? '');
  const base = filename.replace(/\.(svg|png)$/i, '');
  const download = `${base}.svg`;
  const [pngError, setPngError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const downloadPng = async () => {
    setPngError(null);
    setBusy(true);
    try {
      saveBlob(await svgToPngBlob(current()), `${base}.png`);
    } catch (e) {
      setPngError(`The PNG could not be made (${(e as Error).message}); the SVG download still works.`);
    } finally {
      setBusy(false);
    }
  };
  return (
    <figure className={className ?? 'card p-4'} aria-describedby={captionId}>
      {svg !== undefined ? (
        <div
          className="overflow-x-auto [&_svg]:h-auto [&_svg]:max-w-full"
          hidden={live}
          dangerouslySetInnerHTML={{ __html: svg }}
        />
      ) : null}
      <div ref={liveRef} className="overflow-x-auto [&_svg]:h-auto [&_svg]:max-w-full" hidden={!live && svg !== undefined} />
      <figcaption id={captionId} className="mt-2 text-sm text-ink-muted">
        <span className="font-semibold text-ink">{title}.</span> {summary}
      </figcaption>
      {cautions?.length ? (
        <div className="mt-3">
          <CautionList cautions={cautions} label={`Cautions for ${title.charAt(0).toLowerCase()}${title.slice(1)}`} />
        </div>
      ) : null}
      <p className="mt-2 flex flex-wrap gap-2 print:hidden">
        {/* made on click: a data URL in the page would carry the whole SVG a second time (URL-encoded) */}
        <button type="button" className="btn-quiet" onClick={() => saveBlob(new Blob([current()], { type: 'image/svg+xml;charset=utf-8' }), download)}>
          Download SVG
        </button>
        <button type="button" className="btn-quiet" onClick={() => void downloadPng()} disabled={busy}>
          Download PNG
        </button>
      </p>
      {pngError ? <p role="alert" className="mt-1 text-sm text-danger-text">{pngError}</p> : null}
    </figure>
  );
}
