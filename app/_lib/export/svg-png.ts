/**
 * SVG → PNG on the server: the SVG (Observable Plot output from app/_lib/plot-svg.ts) is drawn by
 * Debian's headless Chromium through playwright-core, the only renderer on this machine that
 * draws SVG text and CSS faithfully without extra native packages. The page has JavaScript off
 * and every request aborted, and outside host lookups are mapped to NOTFOUND (the flags of
 * test/e2e/support/browser.ts), so an export never reaches the network.
 *
 * One browser is shared across calls (its launch promise is cached on globalThis) and closes
 * itself after a minute without work; each call gets its own context.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Browser } from 'playwright-core';

/** Options of {@link svgToPng}. */
export interface SvgToPngOptions {
  /** device pixels per CSS pixel (default 2, for sharp slides and print); 1–4 */
  scale?: number;
  /** page colour behind the SVG (default white; 'transparent' keeps the alpha) */
  background?: string;
  /** Chromium binary (default $CHROMIUM_PATH or /usr/bin/chromium) */
  executablePath?: string;
  /** milliseconds before rendering gives up (default 15,000) */
  timeoutMs?: number;
}

const ARGS = [
  '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
  '--disable-component-update', '--disable-sync', '--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE 127.0.0.1, EXCLUDE localhost',
];
const IDLE_CLOSE_MS = 60_000;

interface RendererState { browser: Promise<Browser> | null; profile: string | null; idle: NodeJS.Timeout | null; busy: number }
const g = globalThis as typeof globalThis & { __emberlineSvgPng?: RendererState };
const state: RendererState = (g.__emberlineSvgPng ??= { browser: null, profile: null, idle: null, busy: 0 });

function launch(executablePath: string): Promise<Browser> {
  if (state.browser) return state.browser;
  const profile = mkdtempSync(path.join(os.tmpdir(), 'emberline-svg-png-'));
  state.profile = profile;
  // set synchronously, before any await, so that two first calls share one browser
  state.browser = import('playwright-core').then(({ chromium }) => chromium.launch({
    executablePath, headless: true, args: ARGS,
    env: { ...process.env, HOME: profile, XDG_CONFIG_HOME: profile, XDG_CACHE_HOME: profile },
  })).then((b) => {
    b.on('disconnected', () => { if (state.browser) forget(); });
    return b;
  }, (e: unknown) => {
    forget();
    throw e;
  });
  return state.browser;
}

function forget(): void {
  state.browser = null;
  if (state.profile) rmSync(state.profile, { recursive: true, force: true });
  state.profile = null;
}

/** Closes the shared browser now (tests, shutdown). Safe to call when none is running. */
export async function closeSvgRenderer(): Promise<void> {
  if (state.idle) clearTimeout(state.idle);
  state.idle = null;
  const b = state.browser;
  if (!b) return;
  const browser = await b.catch(() => null);
  forget();
  await browser?.close();
}

/**
 * The CSS size a fragment needs: the widest `<svg>` (width/height attributes, else viewBox, else
 * 640 × 400) and the sum of their heights (a Plot figure stacks a legend above the chart).
 * @example svgSize('<svg width="640" height="400">') // { width: 640, height: 400 }
 */
export function svgSize(markup: string): { width: number; height: number } {
  let width = 0, height = 0;
  for (const [tag] of markup.matchAll(/<svg\b[^>]*>/gi)) {
    const attr = (name: string) => Number(tag.match(new RegExp(`\\s${name}\\s*=\\s*["']?([0-9.]+)`, 'i'))?.[1]);
    const vb = tag.match(/viewBox\s*=\s*["']\s*[-0-9.]+[\s,]+[-0-9.]+[\s,]+([0-9.]+)[\s,]+([0-9.]+)/i);
    let w = attr('width'), h = attr('height');
    if (!(w > 0)) w = vb ? Number(vb[1]) : 640;
    if (!(h > 0)) h = vb ? Number(vb[2]) : 400;
    width = Math.max(width, w);
    height += h;
  }
  return width > 0 ? { width, height } : { width: 640, height: 400 };
}

/**
 * Renders an SVG (or an HTML fragment holding one, such as Plot's `<figure>` with a legend) to PNG.
 * @param svg markup from plotToSvg; it must contain an `<svg>` element
 * @returns the PNG bytes, `scale` × the CSS size of the fragment
 * @throws TypeError when `svg` holds no `<svg>`; RangeError for a scale outside 1–4; the browser's
 *   error when Chromium cannot start or rendering times out.
 * @example const png = await svgToPng(plotToSvg({ marks: [Plot.lineY([1, 3, 2])] }))
 */
export async function svgToPng(svg: string, options: SvgToPngOptions = {}): Promise<Buffer> {
  if (typeof svg !== 'string' || !/<svg\b/i.test(svg)) throw new TypeError('svg must be markup containing an <svg> element');
  const scale = options.scale ?? 2;
  if (!(scale >= 1 && scale <= 4)) throw new RangeError(`scale must be between 1 and 4, got ${scale}`);
  const timeout = options.timeoutMs ?? 15_000;
  const background = options.background ?? 'white';
  if (!/^[#a-zA-Z0-9(),.\s%]+$/.test(background)) throw new RangeError(`background must be a CSS colour, got ${JSON.stringify(background)}`);
  if (state.idle) clearTimeout(state.idle);
  state.idle = null;
  state.busy++;
  try {
    const browser = await launch(options.executablePath ?? process.env.CHROMIUM_PATH ?? '/usr/bin/chromium');
    const { width, height } = svgSize(svg);
    const context = await browser.newContext({
      viewport: { width: Math.ceil(width) + 16, height: Math.ceil(height) + 16 }, deviceScaleFactor: scale, javaScriptEnabled: false,
    });
    try {
      await context.route('**/*', (route) => route.abort());
      const page = await context.newPage();
      page.setDefaultTimeout(timeout);
      await page.setContent(
        `<!doctype html><html><head><meta charset="utf-8"><style>html,body{margin:0;padding:0;background:${background}}` +
          `#plot{display:inline-block}#plot>svg,#plot>figure{display:block;margin:0}</style></head>` +
          `<body><div id="plot">${svg}</div></body></html>`,
        { waitUntil: 'load', timeout },
      );
      return await page.locator('#plot').screenshot({ type: 'png', omitBackground: background === 'transparent', timeout });
    } finally {
      await context.close();
    }
  } finally {
    state.busy--;
    if (state.busy === 0 && state.browser) {
      state.idle = setTimeout(() => { void closeSvgRenderer(); }, IDLE_CLOSE_MS);
      state.idle.unref();
    }
  }
}
