/**
 * `npm run bench -- fit`: times the fitting engine. For every NIST StRD nonlinear problem from both
 * starts: the first (cold) fit, which includes parsing and symbolic differentiation, and — after one untimed
 * round over every problem — the median of repeated warm fits; then a seeded 1,000-resample bootstrap of a 50-trial fit. Figures only, never
 * asserted; a digest of every NIST result shows whether a change altered any number. Needs the
 * reference folder (REFERENCE_DIR or ../shared/reference).
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { bootstrapDerived, fitModel, heatOptimum, type FitInput } from '../analysis/fit';
import { mulberry32 } from '../analysis/fit/random';

const referenceDir = path.resolve(process.env.REFERENCE_DIR ?? path.join(__dirname, '..', '..', 'shared', 'reference'));
const REPEATS = 9;
const median = (v: number[]) => {
  const s = [...v].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

function nistInputs(): { name: string; start: string; input: FitInput }[] {
  const dir = path.join(referenceDir, 'nist-strd');
  const index = JSON.parse(readFileSync(path.join(dir, 'index.json'), 'utf8')) as { name: string; kind: string; file: string }[];
  const out: { name: string; start: string; input: FitInput }[] = [];
  for (const e of index.filter((i) => i.kind === 'nonlinear-least-squares')) {
    const d = JSON.parse(readFileSync(path.join(dir, e.file), 'utf8'));
    let model = (d.exprJs as string).replace(/Math\.PI/g, 'pi').replace(/Math\./g, '');
    let x: number[] = d.x;
    const covariates: Record<string, number[]> = {};
    if (d.predictors) {
      model = model.replace(/\bx1\b/g, 'x');
      x = d.x.map((r: number[]) => r[0]);
      covariates.x2 = d.x.map((r: number[]) => r[1]);
    }
    const y = d.responseTransform === 'log' ? d.y.map(Math.log) : d.y;
    for (const s of ['start1', 'start2']) {
      const start = Object.fromEntries((d.params as string[]).map((k, j) => [k, d[s][j]]));
      out.push({ name: e.name, start: s, input: { x, y, model, start, covariates } });
    }
  }
  return out;
}

function benchNist(): { medians: number[]; total: number } | null {
  if (!existsSync(path.join(referenceDir, 'nist-strd'))) {
    console.log(`NIST StRD not found under ${referenceDir}: set REFERENCE_DIR`);
    return null;
  }
  const cases = nistInputs();
  console.log('NIST StRD nonlinear fits (ms): cold = first fit incl. parse and derivatives; warm = median of', REPEATS);
  console.log('dataset   start    cold    warm');
  const medians: number[] = [];
  const digest = createHash('sha256');
  // cold: each problem's first fit ever (parse, derivatives, compile), before the JIT has seen any
  const colds = cases.map((c) => {
    const t = performance.now();
    const first = fitModel(c.input);
    return { first, cold: performance.now() - t };
  });
  // then one untimed round over every problem, so the warm figures are the steady state of a process
  // that has been fitting for a while (a server), not the first minutes of the JIT
  for (const c of cases) fitModel(c.input);
  for (const [i, c] of cases.entries()) {
    let t: number;
    const { first, cold } = colds[i];
    digest.update(JSON.stringify(first));
    const times: number[] = [];
    for (let r = 0; r < REPEATS; r++) {
      t = performance.now();
      fitModel(c.input);
      times.push(performance.now() - t);
    }
    const m = median(times);
    medians.push(m);
    console.log(`${c.name.padEnd(9)} ${c.start}  ${cold.toFixed(2).padStart(6)}  ${m.toFixed(2).padStart(6)}${first.ok ? '' : '  FAILED: ' + first.reason}`);
  }
  // every result in full, to the last bit (JSON keeps every double exactly): a change that should not
  // alter the numbers must leave this digest as it was
  console.log(`NIST results digest: ${digest.digest('hex').slice(0, 16)} (SHA-256 of every fit's whole result)`);
  const t = performance.now();
  for (const c of cases) fitModel(c.input);
  return { medians, total: performance.now() - t };
}

function benchBootstrap(): number {
  const rand = mulberry32(2024);
  const n = 50;
  const LPM = 1 / 60000;
  const x = Array.from({ length: n }, (_, i) => (2 + (18 * i) / (n - 1)) * LPM);
  const Tin = x.map(() => 20 + rand());
  const y = x.map((v, i) => 90 - (90 - Tin[i]) * Math.exp(-500 / (1000 * v * 4186)) + 0.2 * (rand() + rand() + rand() - 1.5));
  const fit = fitModel({ x, y, model: 'exp-inlet', covariates: { Tin } });
  if (!fit.ok) throw new Error(fit.reason);
  const t = performance.now();
  const b = bootstrapDerived(fit, (c) => {
    const h = heatOptimum(c);
    return h.interior ? h.flowM3PerS : null;
  }, { resamples: 1000, seed: 1 });
  const ms = performance.now() - t;
  if (b.ok) console.log(`bootstrap: flow of maximum heat ${(b.estimate! / LPM).toFixed(2)} L/min, 95 % interval ${(b.ciLow / LPM).toFixed(2)}–${(b.ciHigh / LPM).toFixed(2)} L/min, ${b.defined}/${b.resamples} resamples defined`);
  console.log(`bootstrap: 1000 resamples of a 50-trial exp-inlet fit in ${ms.toFixed(0)} ms`);
  return ms;
}

const nist = benchNist();
const boot = benchBootstrap();
if (nist) {
  const med = median(nist.medians);
  console.log(`NIST: median ${med.toFixed(2)} ms per fit over ${nist.medians.length} fits, slowest ${Math.max(...nist.medians).toFixed(2)} ms, one pass over all ${nist.total.toFixed(0)} ms`);
  console.log(`fit: median ${med.toFixed(2)} ms per NIST fit (target ≤ 1 ms); bootstrap 1000 × 50 trials ${boot.toFixed(0)} ms (target < 1000 ms)`);
} else {
  console.log(`fit: NIST data missing; bootstrap 1000 × 50 trials ${boot.toFixed(0)} ms (target < 1000 ms)`);
}
