import { describe, expect, test } from 'vitest';
import { help, run } from '../../../analysis/cli/fit';
import { readReference, referenceAvailable } from '../../support/reference';

describe('analysis CLI: fit', () => {
  test.skipIf(!referenceAvailable)('prints the contract fields for NIST StRD Misra1a from start 1 (certified b1 = 238.94212918, b2 = 5.5015643181e-4)', () => {
    const d = readReference<{ x: number[]; y: number[]; start1: number[] }>('nist-strd/Misra1a.json');
    const out = run({ x: d.x, y: d.y, model: 'b1*(1-exp(-b2*x))', start: { b1: d.start1[0], b2: d.start1[1] } }) as Record<string, unknown> & { params: Record<string, { value: number; stdErr: number }> };
    expect(out.ok).toBe(true);
    expect(out.params.b1.value).toBeCloseTo(238.94212918, 6);
    expect(out.params.b2.value / 5.5015643181e-4).toBeCloseTo(1, 9);
    for (const k of ['rss', 'residualSD', 'df', 'r2', 'aicc', 'iterations', 'converged']) expect(out).toHaveProperty(k);
    expect(out.converged).toBe(true);
    expect(JSON.parse(JSON.stringify(out))).toEqual(out);
  });

  test('a fit that cannot be done is a result, not an error', () => {
    expect(run({ x: [1, 1, 1], y: [1, 2, 3], model: 'poly1' })).toMatchObject({ ok: false, code: 'degenerate-x' });
  });

  test.each([
    ['not an object', [1, 2]],
    ['x missing', { y: [1], model: 'poly1' }],
    ['a non-numeric cell', { x: [1, 'a'], y: [1, 2], model: 'poly1' }],
    ['model not a string', { x: [1, 2], y: [1, 2], model: 3 }],
  ])('malformed input (%s) throws InputError', (_n, input) => {
    expect(() => run(input)).toThrow(expect.objectContaining({ name: 'InputError' }));
  });

  test('--help documents input, output and exit codes', () => {
    expect(help).toMatch(/exit codes/);
    expect(help).toMatch(/coil, exp-approach, exp-inlet, poly1, poly2, poly3, power/);
  });

  test('detail "full" returns diagnostics without the internal spec', () => {
    const out = run({ x: [1, 2, 3, 4], y: [1, 2.1, 2.9, 4.2], model: 'poly1', detail: 'full' }) as Record<string, unknown>;
    expect(out).toHaveProperty('leverage');
    expect(out).not.toHaveProperty('spec');
  });
});
