// `next build`, skipped when the sources it reads are unchanged since the last build.
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { root, runVisible, step } from './util.mjs';

const INPUTS = ['app', 'analysis', 'entities', 'public', 'package-lock.json', 'next.config.js', 'tailwind.config.ts',
  'postcss.config.mjs', 'tsconfig.json', 'tsconfig.build.json', 'mikro-orm.config.ts', 'instrumentation.ts', 'proxy.ts'];
const stampFile = path.join(root, '.next', 'emberline-source-hash');

function walk(p, out) {
  const st = statSync(p);
  if (st.isDirectory()) for (const e of readdirSync(p).sort()) walk(path.join(p, e), out);
  else out.push(p);
}

export function sourceHash() {
  const h = createHash('sha256');
  const files = [];
  for (const i of INPUTS) if (existsSync(path.join(root, i))) walk(path.join(root, i), files);
  for (const f of files) {
    h.update(path.relative(root, f));
    h.update('\0');
    h.update(readFileSync(f));
  }
  return h.digest('hex');
}

/** Builds the app unless .next holds a build of exactly these sources. Returns true if it built. */
export function buildIfChanged() {
  const before = sourceHash();
  if (existsSync(path.join(root, '.next', 'BUILD_ID')) && existsSync(stampFile) && readFileSync(stampFile, 'utf8') === before) {
    step('sources unchanged since the last build: skipping next build');
    return false;
  }
  step('building the web app (next build)');
  runVisible(process.execPath, [path.join(root, 'node_modules/next/dist/bin/next'), 'build'], 'next build failed (see above)', {
    env: { ...process.env, NEXT_TELEMETRY_DISABLED: '1', NODE_ENV: 'production' },
  });
  // next build may touch tsconfig.json; hash after it so the next run sees the same inputs.
  writeFileSync(stampFile, sourceHash());
  return true;
}
