/**
 * The committed files of public/: the icons made from public/icon.svg by `npm run icons` are what
 * the metadata and the manifest say they are. Formats: PNG's signature and IHDR chunk (W3C PNG
 * specification, 2nd ed., §5.2 and §11.2.2) and the ICO directory (ICONDIR/ICONDIRENTRY, from
 * memory of the Windows icon format: 6-byte header, 16-byte entries, PNG payloads allowed).
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, test } from 'vitest';

const pub = path.resolve(__dirname, '..', '..', 'public');
const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

function pngSize(png: Buffer): { width: number; height: number } {
  expect(png.subarray(0, 8).equals(PNG_SIGNATURE)).toBe(true);
  expect(png.toString('latin1', 12, 16)).toBe('IHDR');
  return { width: png.readUInt32BE(16), height: png.readUInt32BE(20) };
}

function icoEntries(ico: Buffer) {
  expect(ico.readUInt16LE(0)).toBe(0);
  expect(ico.readUInt16LE(2)).toBe(1);
  return Array.from({ length: ico.readUInt16LE(4) }, (_, i) => {
    const e = 6 + 16 * i;
    const size = ico.readUInt8(e) || 256;
    const length = ico.readUInt32LE(e + 8);
    const offset = ico.readUInt32LE(e + 12);
    return { size, png: ico.subarray(offset, offset + length) };
  });
}

describe('public/ icons', () => {
  test('favicon.ico holds 16, 32 and 48 px PNG images of the sizes its directory states', () => {
    const entries = icoEntries(readFileSync(path.join(pub, 'favicon.ico')));
    expect(entries.map((e) => e.size)).toEqual([16, 32, 48]);
    for (const e of entries) expect(pngSize(e.png)).toEqual({ width: e.size, height: e.size });
  });

  test('the touch icon and the manifest icons have the sizes they are announced with', () => {
    expect(pngSize(readFileSync(path.join(pub, 'apple-touch-icon.png')))).toEqual({ width: 180, height: 180 });
    const manifest = JSON.parse(readFileSync(path.join(pub, 'manifest.webmanifest'), 'utf8')) as { icons: { src: string; sizes: string; type: string }[] };
    for (const icon of manifest.icons.filter((i) => i.type === 'image/png')) {
      const [w, h] = icon.sizes.split('x').map(Number);
      expect(pngSize(readFileSync(path.join(pub, icon.src)))).toEqual({ width: w, height: h });
    }
    expect(readFileSync(path.join(pub, 'icon.svg'), 'utf8')).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
  });
});
