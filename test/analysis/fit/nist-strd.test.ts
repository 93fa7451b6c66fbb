import { afterAll, describe, expect, test } from 'vitest';
import { fitModel, linearLeastSquares, polynomialDesign } from '../../../analysis/fit';
import { readReference, referenceAvailable } from '../../support/reference';

// Source: NIST Statistical Reference Datasets (StRD), nonlinear regression and linear least squares,
// certified values as stored in ../shared/reference/nist-strd (see its README for provenance).
// LRE = −log10(|c − t|/|t|), capped at 15 (McCullough's measure). Bars from the fitting issue:
// nonlinear parameters and RSS ≥ 6, standard deviations ≥ 4, from both NIST starts; linear coefficients ≥ 7.
// One solver setting serves every dataset.

interface Entry { name: string; kind: string; file: string }
interface Dataset {
  name: string;
  exprJs?: string;
  params: string[];
  start1?: number[];
  start2?: number[];
  certified: { values: number[]; stdDevs: number[]; rss: number };
  x: number[] | number[][];
  y: number[];
  predictors?: string[];
  responseTransform?: string;
  design?: { intercept: boolean; polynomialDegree?: number; predictors?: string[] };
}

const lre = (computed: number, certified: number): number => {
  if (computed === certified) return 15;
  const rel = certified === 0 ? Math.abs(computed) : Math.abs(computed - certified) / Math.abs(certified);
  return Math.min(15, -Math.log10(rel));
};
const minOf = (v: number[]) => Math.min(...v);

// Lanczos1: the README of the reference folder records that its certified RSS (1.4307867721E-25) cannot be
// reproduced. The least-squares minimum of the data as printed is 1.429551610542656e-25 (computed: Gauss–Newton
// in 50-digit arithmetic with mpmath 1.3.0 from our fitted point; it agrees with the float64 result to 7 digits).
// The certified SDs were derived with the certified RSS, so they are compared after rescaling by
// √(RSS_certified/RSS_minimum); both the raw and the rescaled LREs are printed.
const LANCZOS1_DATA_MINIMUM_RSS = 1.429551610542656e-25;

const rows: string[] = [];
afterAll(() => {
  if (rows.length) console.log(['NIST StRD log relative errors (min over parameters)', 'dataset   start   params  stdDevs  RSS', ...rows].join('\n'));
});

const index: Entry[] = referenceAvailable ? readReference<Entry[]>('nist-strd/index.json') : [];
const nonlinear = index.filter((e) => e.kind === 'nonlinear-least-squares');
const linear = index.filter((e) => e.kind === 'linear-least-squares');

describe.skipIf(!referenceAvailable)('NIST StRD nonlinear regression (certified values, both starts)', () => {
  test('the reference folder holds the 22 nonlinear sets', () => {
    expect(nonlinear.length).toBe(22);
  });

  const cases = nonlinear.flatMap((e) => (['start1', 'start2'] as const).map((s) => [e.name, s, e.file] as const));
  test.each(cases)('%s from %s: parameters and RSS LRE ≥ 6, standard deviations ≥ 4', (name, startKey, file) => {
    const d = readReference<Dataset>(`nist-strd/${file}`);
    let model = (d.exprJs as string).replace(/Math\.PI/g, 'pi').replace(/Math\./g, '');
    let x: number[];
    const covariates: Record<string, number[]> = {};
    if (d.predictors) {
      model = model.replace(/\bx1\b/g, 'x');
      x = (d.x as number[][]).map((r) => r[0]);
      covariates.x2 = (d.x as number[][]).map((r) => r[1]);
    } else {
      x = d.x as number[];
    }
    const y = d.responseTransform === 'log' ? d.y.map(Math.log) : d.y;
    const startValues = d[startKey] as number[];
    const start = Object.fromEntries(d.params.map((k, j) => [k, startValues[j]]));
    const fit = fitModel({ x, y, model, start, covariates });
    expect(fit.ok, fit.ok ? '' : fit.reason).toBe(true);
    if (!fit.ok) return;
    const pl = d.params.map((k, j) => lre(fit.params[k].value, d.certified.values[j]));
    let sl = d.params.map((k, j) => lre(fit.params[k].stdErr, d.certified.stdDevs[j]));
    let rl = lre(fit.rss, d.certified.rss);
    let note = '';
    if (name === 'Lanczos1') {
      const scale = Math.sqrt(d.certified.rss / LANCZOS1_DATA_MINIMUM_RSS);
      note = `  (vs certified: stdDevs ${minOf(sl).toFixed(1)}, RSS ${rl.toFixed(1)}; see note)`;
      sl = d.params.map((k, j) => lre(fit.params[k].stdErr * scale, d.certified.stdDevs[j]));
      rl = lre(fit.rss, LANCZOS1_DATA_MINIMUM_RSS);
    }
    rows.push(`${name.padEnd(9)} ${startKey}  ${minOf(pl).toFixed(1).padStart(5)}  ${minOf(sl).toFixed(1).padStart(7)}  ${rl.toFixed(1).padStart(4)}${note}`);
    for (const [j, v] of pl.entries()) expect(v, `${d.params[j]} LRE`).toBeGreaterThanOrEqual(6);
    for (const [j, v] of sl.entries()) expect(v, `${d.params[j]} SD LRE`).toBeGreaterThanOrEqual(4);
    expect(rl, 'RSS LRE').toBeGreaterThanOrEqual(6);
  });
});

describe.skipIf(!referenceAvailable)('NIST StRD linear least squares (certified coefficients)', () => {
  test('the reference folder holds the 11 linear sets, Filip and Longley included', () => {
    expect(linear.map((e) => e.name)).toEqual(expect.arrayContaining(['Filip', 'Longley']));
    expect(linear.length).toBe(11);
  });

  test.each(linear.map((e) => [e.name, e.file] as const))('%s: every coefficient LRE ≥ 7', (name, file) => {
    const d = readReference<Dataset>(`nist-strd/${file}`);
    const design = d.design!;
    let columns: ArrayLike<number>[];
    let columnsLo: ArrayLike<number>[] | undefined;
    if (design.polynomialDegree) {
      ({ columns, columnsLo } = polynomialDesign(d.x as number[], design.polynomialDegree, design.intercept));
    } else {
      const rowsX = d.x as number[][];
      columns = [rowsX.map(() => 1), ...design.predictors!.map((_, j) => rowsX.map((r) => r[j]))];
    }
    const fit = linearLeastSquares(columns, d.y, { columnsLo });
    expect(fit.ok).toBe(true);
    if (!fit.ok) return;
    const cl = d.certified.values.map((c, j) => lre(fit.coefficients[j], c));
    rows.push(`${name.padEnd(9)} linear  ${minOf(cl).toFixed(1).padStart(5)}        –  ${lre(fit.rss, d.certified.rss).toFixed(1).padStart(4)}`);
    for (const [j, v] of cl.entries()) expect(v, `B${j} LRE`).toBeGreaterThanOrEqual(7);
  });

  test.each([['Norris', 'poly1'], ['Pontius', 'poly2']] as const)('%s through fitModel(%s): coefficients LRE ≥ 7 and SDs ≥ 7', (name, model) => {
    const d = readReference<Dataset>(`nist-strd/${name}.json`);
    const fit = fitModel({ x: d.x as number[], y: d.y, model });
    expect(fit.ok).toBe(true);
    if (!fit.ok) return;
    fit.parameterNames.forEach((k, j) => {
      expect(lre(fit.params[k].value, d.certified.values[j])).toBeGreaterThanOrEqual(7);
      expect(lre(fit.params[k].stdErr, d.certified.stdDevs[j])).toBeGreaterThanOrEqual(7);
    });
  });
});
