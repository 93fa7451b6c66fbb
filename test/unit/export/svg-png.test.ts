import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { inflateSync } from 'node:zlib';
import * as Plot from '@observablehq/plot';
import { parseHTML } from 'linkedom';
import { afterAll, describe, expect, test } from 'vitest';
import { closeSvgRenderer, svgSize, svgToPng } from '../../../app/_lib/export/svg-png';

/**
 * A minimal PNG reader for 8-bit RGB/RGBA, non-interlaced images, written from the PNG
 * specification (W3C, Portable Network Graphics (PNG) Specification, 2nd ed., §11.2.2 IHDR and
 * §9 filters 0–4 with the Paeth predictor).
 */
function decodePng(buf: Buffer): { width: number; height: number; pixel: (x: number, y: number) => number[] } {
  expect(buf.subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]));
  let off = 8, width = 0, height = 0, channels = 0;
  const idat: Buffer[] = [];
  while (off < buf.length) {
    const len = buf.readUInt32BE(off), type = buf.toString('latin1', off + 4, off + 8), data = buf.subarray(off + 8, off + 8 + len);
    if (type === 'IHDR') {
      width = data.readUInt32BE(0); height = data.readUInt32BE(4);
      expect(data[8]).toBe(8); // bit depth
      expect(data[12]).toBe(0); // no interlace
      channels = data[9] === 6 ? 4 : data[9] === 2 ? 3 : 0;
      expect(channels).toBeGreaterThan(0);
    } else if (type === 'IDAT') idat.push(data);
    off += 12 + len;
  }
  const raw = inflateSync(Buffer.concat(idat));
  const stride = width * channels, out = Buffer.alloc(stride * height);
  for (let y = 0; y < height; y++) {
    const f = raw[y * (stride + 1)];
    for (let i = 0; i < stride; i++) {
      const x = raw[y * (stride + 1) + 1 + i];
      const a = i >= channels ? out[y * stride + i - channels] : 0;
      const b = y > 0 ? out[(y - 1) * stride + i] : 0;
      const c = i >= channels && y > 0 ? out[(y - 1) * stride + i - channels] : 0;
      const p = a + b - c, pa = Math.abs(p - a), pb = Math.abs(p - b), pc = Math.abs(p - c);
      const paeth = pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
      const pred = [0, a, b, (a + b) >> 1, paeth][f];
      out[y * stride + i] = (x + pred) & 0xff;
    }
  }
  return { width, height, pixel: (x, y) => [...out.subarray(y * stride + x * channels, y * stride + x * channels + 3)] };
}

const RECT = '<svg xmlns="http://www.w3.org/2000/svg" width="40" height="20"><rect x="0" y="0" width="20" height="20" fill="#ff0000"/></svg>';

afterAll(async () => { await closeSvgRenderer(); });

describe('svgToPng (headless Chromium through playwright-core)', () => {
  test('draws the SVG at its CSS size times the scale, on white (PNG spec read-back)', async () => {
    const one = decodePng(await svgToPng(RECT, { scale: 1 }));
    expect([one.width, one.height]).toEqual([40, 20]);
    expect(one.pixel(5, 10)).toEqual([255, 0, 0]);
    expect(one.pixel(35, 10)).toEqual([255, 255, 255]);
    const two = decodePng(await svgToPng(RECT));
    expect([two.width, two.height]).toEqual([80, 40]);
    expect(two.pixel(10, 20)).toEqual([255, 0, 0]);
  });

  test('renders an Observable Plot drawn with linkedom, as app/_lib/plot-svg.ts does', async () => {
    const { document } = parseHTML('<!doctype html><html><body></body></html>');
    const el = Plot.plot({
      width: 320, height: 200, document: document as unknown as Document,
      marks: [Plot.lineY([20, 35, 48, 55, 58], { stroke: '#c2410c' }), Plot.ruleY([20])],
    });
    const svg = (el as unknown as { outerHTML: string }).outerHTML;
    expect(svgSize(svg)).toEqual({ width: 320, height: 200 });
    const png = decodePng(await svgToPng(svg, { scale: 1 }));
    expect([png.width, png.height]).toEqual([320, 200]);
  });

  test('fetches nothing the SVG points at, even on 127.0.0.1 (requests aborted; common practice for server rendering)', async () => {
    let hits = 0;
    const server = createServer((_req, res) => { hits++; res.end(); });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const { port } = server.address() as AddressInfo;
    try {
      const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><style>@import url("http://127.0.0.1:${port}/a.css");</style>` +
        `<image href="http://127.0.0.1:${port}/x.png" width="10" height="10"/></svg>`;
      decodePng(await svgToPng(svg, { scale: 1 }));
      expect(hits).toBe(0);
    } finally {
      await new Promise((resolve) => server.close(resolve));
    }
  });

  test('refuses markup without an <svg> and a scale outside 1–4 (STYLE.md §10)', async () => {
    await expect(svgToPng('<div>no plot</div>')).rejects.toThrow(TypeError);
    await expect(svgToPng(RECT, { scale: 8 })).rejects.toThrow(/scale must be between 1 and 4, got 8/);
    await expect(svgToPng(RECT, { background: 'red;}</style><script>' })).rejects.toThrow(RangeError);
  });

  test('sizes a fragment from its widest SVG and summed heights (viewBox when no width)', () => {
    expect(svgSize('<svg viewBox="0 0 300 150"></svg>')).toEqual({ width: 300, height: 150 });
    expect(svgSize('<figure><svg width="15" height="15"></svg><svg width="640" height="400"></svg></figure>')).toEqual({ width: 640, height: 415 });
    expect(svgSize('<svg></svg>')).toEqual({ width: 640, height: 400 });
  });
});
