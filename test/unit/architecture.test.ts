/**
 * The shape of the house (DEVELOPERS.md "Map"): rules a newcomer can break without noticing, so a
 * test keeps them. Common practice: each rule is written once and used by every path.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, test } from 'vitest';

const root = path.resolve(__dirname, '..', '..');
function walk(dir: string, out: string[] = []): string[] {
  for (const e of readdirSync(dir)) {
    const p = path.join(dir, e);
    if (statSync(p).isDirectory()) walk(p, out);
    else if (/\.(ts|tsx)$/.test(e)) out.push(p);
  }
  return out;
}
const appFiles = walk(path.join(root, 'app'));
const rel = (f: string) => path.relative(root, f);
const entryPoints = appFiles.filter((f) => /(^|\/)(page|layout|route)\.tsx?$/.test(f) && !rel(f).startsWith('app/_lib/'));

describe('entry points load through app/_lib', () => {
  test('no page, layout or route file imports an entity: they call named queries and loadInLab()', () => {
    const offenders = entryPoints.filter((f) => /from '(@\/entities|(\.\.\/)+entities)[/']/.test(readFileSync(f, 'utf8'))).map(rel);
    expect(offenders).toEqual([]);
  });
  test('ids are recognised by one UUID rule (app/_lib/labs/load-in-lab.ts)', () => {
    const offenders = appFiles.filter((f) => !f.endsWith('load-in-lab.ts') && /\[0-9a-f\](\{8\}|-\]\{36\})/.test(readFileSync(f, 'utf8'))).map(rel);
    expect(offenders).toEqual([]);
  });
  test('the app calls typed analysis functions, never the command-line adapters', () => {
    expect(appFiles.filter((f) => /from '@\/analysis\/cli/.test(readFileSync(f, 'utf8'))).map(rel)).toEqual([]);
  });
});

describe('one error model (app/_lib/server/errors.ts)', () => {
  test('errors are told apart by class and kind, never by their name or by parsing their message', () => {
    const offenders = appFiles.filter((f) => /\.name === '\w*Error'|HttpError/.test(readFileSync(f, 'utf8'))).map(rel);
    expect(offenders).toEqual([]);
  });
});

describe('the analysis worker loads no server-only code (app/_lib/analysis-worker)', () => {
  /** Every source file the worker's tasks reach through imports that ship code (`import type` is erased). */
  function reachable(start: string): string[] {
    const seen = new Set<string>();
    const todo = [start];
    while (todo.length) {
      const file = todo.pop()!;
      if (seen.has(file)) continue;
      seen.add(file);
      const text = readFileSync(file, 'utf8');
      for (const m of text.matchAll(/^(?:import|export) (?!type )[^'"]*?from\s*['"]([^'"]+)['"]|^import\s*['"]([^'"]+)['"]/gm)) {
        const spec = m[1] ?? m[2];
        const base = spec.startsWith('@/') ? path.join(root, spec.slice(2)) : spec.startsWith('.') ? path.resolve(path.dirname(file), spec) : null;
        if (!base) continue;
        const found = [`${base}.ts`, `${base}.tsx`, path.join(base, 'index.ts')].find((f) => { try { return statSync(f).isFile(); } catch { return false; } });
        if (found) todo.push(found);
      }
    }
    return [...seen];
  }
  const files = reachable(path.join(root, 'app/_lib/analysis-worker/tasks.ts'));
  test('the scan follows the tasks into fits, forecasts, plots and analysis', () => {
    expect(files.map(rel)).toEqual(expect.arrayContaining(['app/_lib/fits/fit-compute.ts', 'app/_lib/forecasts/forecast-compute.ts', 'app/_plots/fit-curve.ts', 'analysis/fit/index.ts']));
  });
  test('no file it reaches imports server-only, an entity or the ORM (a worker thread cannot load them)', () => {
    const offenders = files.filter((f) => /^import ['"]server-only['"]|^import (?!type )[^'"]*from ['"](@\/entities|@mikro-orm)/m.test(readFileSync(f, 'utf8'))).map(rel);
    expect(offenders).toEqual([]);
  });
});
