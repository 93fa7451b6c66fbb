/**
 * The direction of imports around the contracts (DEVELOPERS.md, "Module map"): `app/_lib` never
 * imports React components (the shapes that cross to the browser live in `app/_contracts`), and
 * `app/_contracts` stays isomorphic — no React, no 'server-only', no entities, no `app/_lib`, no
 * components — so that server code and client components can both import it. Common practice
 * (layered architecture); the scan reads every import specifier of the source files.
 */
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, test } from 'vitest';

const root = path.resolve(__dirname, '..', '..', '..');

function files(dir: string): string[] {
  return readdirSync(path.join(root, dir), { withFileTypes: true }).flatMap((e) => {
    const rel = path.join(dir, e.name);
    if (e.isDirectory()) return files(rel);
    return /\.(ts|tsx|mts|mjs|js)$/.test(e.name) ? [rel] : [];
  });
}

/** Every module a file imports or re-exports (static and dynamic), resolved to a path from the root when relative. */
function importsOf(file: string): string[] {
  const text = readFileSync(path.join(root, file), 'utf8');
  const specs = [...text.matchAll(/(?:^|[^\w.])(?:import|export)\s[^'"]*?from\s*['"]([^'"]+)['"]|(?:^|[^\w.])import\s*\(?\s*['"]([^'"]+)['"]/gm)].map((m) => m[1] ?? m[2]);
  return specs.map((s) => (s.startsWith('.') ? path.normalize(path.join(path.dirname(file), s)) : s.replace(/^@\//, '')));
}

describe('app/_lib does not import from app/_components', () => {
  const lib = files('app/_lib');
  test('the scan sees the server code', () => expect(lib.length).toBeGreaterThan(50));
  test.each(lib)('%s', (file) => {
    expect(importsOf(file).filter((s) => s.startsWith('app/_components'))).toEqual([]);
  });
});

describe('app/_contracts is isomorphic: types and small pure helpers only', () => {
  const contracts = files('app/_contracts');
  test('the scan sees the contracts', () => expect(contracts.length).toBeGreaterThan(3));
  test.each(contracts)('%s', (file) => {
    const bad = importsOf(file).filter((s) => /^(react|react-dom|next|server-only|swr)(\/|$)/.test(s) || /^(entities|app\/_lib|app\/_components)(\/|$)/.test(s) || s === 'mathjs');
    expect(bad).toEqual([]);
    const text = readFileSync(path.join(root, file), 'utf8');
    expect(text).not.toMatch(/^['"]use (client|server)['"]/m);
  });
});

describe('app/_plots is isomorphic: the plot builders both sides draw with', () => {
  const plots = files('app/_plots');
  test('the scan sees the builders', () => expect(plots.length).toBeGreaterThan(5));
  test.each(plots)('%s', (file) => {
    // no server code, no React, and nothing that pulls in mathjs (the fitting engine, the units parser):
    // client components import these. `import type` lines ship nothing and are left out of the scan.
    const text = readFileSync(path.join(root, file), 'utf8');
    const shipped = [...text.matchAll(/^import (?!type )[^'"]*['"]([^'"]+)['"]/gm)].map((m) => (m[1].startsWith('.') ? path.normalize(path.join(path.dirname(file), m[1])) : m[1].replace(/^@\//, '')));
    const bad = shipped.filter((s) => /^(react|react-dom|next|server-only|swr|linkedom|mathjs)(\/|$)/.test(s) || /^(entities|app\/_lib|app\/_components)(\/|$)/.test(s) || /^analysis\/(fit|units\/(math|parse-quantity))(\/|$)/.test(s));
    expect(bad).toEqual([]);
    expect(text).not.toMatch(/^['"]use (client|server)['"]/m);
  });
});
