import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { expect, test } from 'vitest';

const root = path.resolve(__dirname, '..', '..');

// The Next build type-checks only the app's sources; this covers tests, scripts and benchmarks too.
test('the whole project type-checks under strict TypeScript', () => {
  const r = spawnSync(process.execPath, [path.join(root, 'node_modules/typescript/bin/tsc'), '--noEmit', '-p', root], { encoding: 'utf8', timeout: 180_000 });
  expect(r.stdout + r.stderr).toBe('');
  expect(r.status).toBe(0);
}, 200_000);
