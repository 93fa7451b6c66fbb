/**
 * The one schema of `Fit.result` (app/_lib/fits/stored-fit.ts): a result written as saveFit
 * writes it, for the demo lab's first rig (fixtures/demo-lab.ts: the constant-source coil of
 * DOMAIN.md §1.2 with seeded noise), parses; a malformed one is refused with a message that names
 * the fit and the field.
 */
import { describe, expect, test } from 'vitest';
import { compareModels } from '../../../analysis/fit';
import { generateTrials, rigPlans } from '../../../fixtures/demo-lab';
import { DEFAULT_MEASUREMENT_SD_K, fitData, modelLabel } from '../../../app/_lib/fits/fit-analysis';
import { parseStoredFit, StoredFitError, storedFitResult } from '../../../app/_lib/fits/stored-fit';

function demoResult() {
  const trials = generateTrials(rigPlans[0]).map((t, i) => ({ ...t, id: `00000000-0000-4000-8000-${String(i).padStart(12, '0')}`, notes: '' }));
  const data = fitData(trials as never);
  const comparison = compareModels({ ...data, measurementSD: DEFAULT_MEASUREMENT_SD_K }, ['coil', 'exp-inlet'].map((m) => ({ label: modelLabel(m), model: m })));
  const fit = comparison.ranking.find((r) => r.model === 'coil')!.fit!;
  const meanTin = data.covariates.Tin.reduce((a, b) => a + b, 0) / trials.length;
  // what the JSON column gives back
  return { trials, stored: JSON.parse(JSON.stringify(storedFitResult(fit, comparison, Math.round(meanTin * 10) / 10, trials))) as Record<string, unknown> };
}

describe('parseStoredFit', () => {
  test('reads a stored result of the demo lab (coil fit of Stovepipe Coil A)', () => {
    const { trials, stored } = demoResult();
    const r = parseStoredFit(stored, 'demo');
    expect(r.fit.model).toBe('coil');
    expect(r.fit.parameterNames).toEqual(['Ts', 'UA']);
    // the demo coil is generated with Ts and UA of its plan (fixtures/demo-lab.ts); the fit finds them within noise
    expect(r.fit.params.Ts.value).toBeCloseTo(rigPlans[0].sourceC, -1);
    expect(r.trials).toHaveLength(trials.length);
    expect(r.performance.rows).toHaveLength(8);
    expect(r.choice.minimumFlows.length).toBeGreaterThan(0);
  });

  test.each([
    ['a missing fit', (s: Record<string, any>): void => void delete s.fit, /fit: /],
    ['a parameter without an estimate', (s: Record<string, any>): void => void delete s.fit.params.UA, /fit: every parameter name needs an estimate/],
    ['an estimate that is text', (s: Record<string, any>): void => void (s.fit.params.Ts.value = '90'), /fit\.params\.Ts\.value/],
    ['trials that are not a list', (s: Record<string, any>): void => void (s.trials = {}), /trials: /],
    ['a trial time that is not ISO 8601', (s: Record<string, any>): void => void (s.trials[0].startedAt = 'yesterday'), /trials\.0\.startedAt/],
  ] as const)('refuses %s, naming the fit and the field', (_what, spoil, field) => {
    const { stored } = demoResult();
    spoil(stored as Record<string, any>);
    expect(() => parseStoredFit(stored, 'f-1')).toThrow(StoredFitError);
    expect(() => parseStoredFit(stored, 'f-1')).toThrow(/^The stored result of fit f-1 is malformed/);
    expect(() => parseStoredFit(stored, 'f-1')).toThrow(field);
  });

  test('refuses a result that is not an object', () => {
    expect(() => parseStoredFit(null)).toThrow(/^The stored result of a fit is malformed \(\(the result\): /);
  });
});
