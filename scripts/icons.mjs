#!/usr/bin/env node
// The app icons in public/, drawn from the one source public/icon.svg:
//   favicon.ico            16, 32 and 48 px (PNG entries), for browsers that ask for /favicon.ico
//   apple-touch-icon.png   180 px on the icon's own dark ground (iOS rounds the corners itself)
//   icon-192.png, icon-512.png   for the web app manifest (public/manifest.webmanifest)
// The PNGs are committed; run `npm run icons` after changing icon.svg and commit what it writes.
// sharp comes with Next.js (its image optimizer), so nothing is installed for this.
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { root, fail, runMain } from './lib/util.mjs';

/** the icon's ground colour (the rect of icon.svg), behind the square touch icon */
const GROUND = '#241E1B';

/** An ICO file holding PNG images (allowed since Windows Vista, read by every current browser). */
function icoFromPngs(images) {
  const header = Buffer.alloc(6);
  header.writeUInt16LE(0, 0); // reserved
  header.writeUInt16LE(1, 2); // type: icon
  header.writeUInt16LE(images.length, 4);
  let offset = 6 + 16 * images.length;
  const entries = images.map(({ size, png }) => {
    const e = Buffer.alloc(16);
    e.writeUInt8(size >= 256 ? 0 : size, 0); // width (0 means 256)
    e.writeUInt8(size >= 256 ? 0 : size, 1); // height
    e.writeUInt8(0, 2); // no palette
    e.writeUInt8(0, 3); // reserved
    e.writeUInt16LE(1, 4); // colour planes
    e.writeUInt16LE(32, 6); // bits per pixel
    e.writeUInt32LE(png.length, 8);
    e.writeUInt32LE(offset, 12);
    offset += png.length;
    return e;
  });
  return Buffer.concat([header, ...entries, ...images.map((i) => i.png)]);
}

async function main() {
  let sharp;
  try {
    sharp = (await import('sharp')).default;
  } catch {
    fail('sharp is missing (it comes with next): run npm ci first');
  }
  const dir = path.join(root, 'public');
  const svg = readFileSync(path.join(dir, 'icon.svg'));
  const png = (size, ground) => {
    let img = sharp(svg, { density: Math.ceil((72 * size) / 32) }).resize(size, size);
    if (ground) img = img.flatten({ background: ground });
    return img.png({ compressionLevel: 9 }).toBuffer();
  };
  const ico = await Promise.all([16, 32, 48].map(async (size) => ({ size, png: await png(size) })));
  writeFileSync(path.join(dir, 'favicon.ico'), icoFromPngs(ico));
  writeFileSync(path.join(dir, 'apple-touch-icon.png'), await png(180, GROUND));
  for (const size of [192, 512]) writeFileSync(path.join(dir, `icon-${size}.png`), await png(size));
  console.log('wrote public/favicon.ico, apple-touch-icon.png, icon-192.png, icon-512.png from public/icon.svg');
}

runMain(main);
