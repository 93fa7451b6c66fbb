#!/usr/bin/env node
// `npm run bench -- NAME` runs bench/NAME.ts with tsx. Each benchmark prints its figures and ends
// with one headline line. Benchmarks are never part of `npm test`.
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';

const root = path.resolve(path.dirname(new URL(import.meta.url).pathname), '..');
const name = process.argv[2];
const available = readdirSync(path.join(root, 'bench')).filter((f) => f.endsWith('.ts')).map((f) => f.slice(0, -3));
if (!name || !existsSync(path.join(root, 'bench', `${name}.ts`))) {
  console.error(`usage: npm run bench -- NAME   (available: ${available.join(', ') || 'none yet'})`);
  process.exit(2);
}
const r = spawnSync(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'bench', `${name}.ts`), ...process.argv.slice(3)], {
  stdio: 'inherit',
  cwd: root,
  env: { ...process.env, NODE_ENV: 'production', NEXT_TELEMETRY_DISABLED: '1' },
});
process.exit(r.status ?? 1);
