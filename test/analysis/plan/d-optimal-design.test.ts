import { describe, expect, test } from 'vitest';
import { approximateDesign, approximateDesignOnRange, exactDesign } from '../../../analysis/plan/d-optimal-design';
import { informationMatrix, logDet, symmetricInverse } from '../../../analysis/plan/information-matrix';
import { builtinResponseModel, responseAt } from '../../../analysis/plan/model-response';

const LPM = 1 / 60000;

describe('approximate locally D-optimal designs against closed forms', () => {
  // Exponential decay y − Tin = A·e^(−kx) (the exp-inlet model): the locally D-optimal design on [a, b] is the two
  // points {a, a + 1/k} with weights ½ when a + 1/k ≤ b (Box & Lucas, Biometrika 46 (1959), and Atkinson, Donev &
  // Tobias, "Optimum Experimental Designs, with SAS" (2007), ch. 17 — from memory). Closed form derived here:
  // with g = (e^(−kx), −A·x·e^(−kx)), det M of the equal-weight pair is ¼A²e^(−2k(x₁+x₂))(x₂ − x₁)², which falls
  // with x₁ (so x₁ = a) and is largest at x₂ − x₁ = 1/k.
  const A = 60;
  const k = 0.1 / LPM; // 0.1 per L/min, as check value #3
  const expRow = (() => {
    const r = responseAt(builtinResponseModel('exp-inlet'), 20);
    return (x: number) => r([A, k], [x]).rows[0];
  })();

  test('exp-inlet on 2–20 L/min: support {2, 12} L/min (a + 1/k), weights ½, and max gᵀM⁻¹g = p (Kiefer–Wolfowitz equivalence)', () => {
    const d = approximateDesignOnRange(expRow, [2 * LPM, 20 * LPM])!;
    expect(d.points).toHaveLength(2);
    expect(d.points[0].x / LPM).toBeCloseTo(2, 6);
    expect(d.points[1].x / LPM).toBeCloseTo(12, 5);
    for (const s of d.points) expect(s.weight).toBeCloseTo(0.5, 8);
    expect(d.maxVariance).toBeCloseTo(2, 6);
  });
  test('exp-inlet on 2–8 L/min (a + 1/k beyond the range): the two ends', () => {
    const d = approximateDesignOnRange(expRow, [2 * LPM, 8 * LPM])!;
    expect(d.points.map((s) => s.x / LPM)).toEqual([expect.closeTo(2, 6), expect.closeTo(8, 6)]);
  });
  // Michaelis–Menten y = V·x/(K + x) on (0, b]: D-optimal points {K·b/(b + 2K), b}, weights ½ (Atkinson, Donev &
  // Tobias 2007, ch. 17 — from memory). Derived: det ∝ [x₁x₂(x₂ − x₁)/((K + x₁)²(K + x₂)²)]², largest at x₂ = b and
  // d/dx₁ = 0 ⇔ bK − x₁(b + 2K) = 0.
  test.each([[1, 4], [2, 10], [0.5, 1]])('Michaelis–Menten K = %s, b = %s: x₁ = K·b/(b + 2K), x₂ = b', (K, b) => {
    const V = 3;
    const d = approximateDesignOnRange((x) => [x / (K + x), (-V * x) / (K + x) ** 2], [0, b])!;
    expect(d.points[0].x).toBeCloseTo((K * b) / (b + 2 * K), 6);
    expect(d.points[1].x).toBeCloseTo(b, 8);
    expect(d.maxVariance).toBeCloseTo(2, 6);
  });
  test('straight line on [0, 1]: the D-optimal design puts half the weight at each end (common practice, closed form)', () => {
    const d = approximateDesign(Array.from({ length: 11 }, (_, i) => [1, i / 10]))!;
    expect(d.weights[0]).toBeCloseTo(0.5, 6);
    expect(d.weights[10]).toBeCloseTo(0.5, 6);
    expect(d.maxVariance).toBeCloseTo(2, 6);
  });
  test('fewer independent rows than parameters → null', () => {
    expect(approximateDesign([[1, 2], [2, 4]])).toBeNull();
  });
});

describe('exact designs against a brute-force search (coil at Ts 90 °C, UA 400 W/K, Tin 15 °C, 41 flows 2–20 L/min)', () => {
  const r = responseAt(builtinResponseModel('coil'), 15);
  const flows = Array.from({ length: 41 }, (_, i) => (2 + (18 * i) / 40) * LPM);
  const rows = r([90, 400], flows).rows;
  const ld = (idx: number[]) => logDet(informationMatrix(idx.map((i) => rows[i]), 2), 2);

  test('every 2-point design: the exchange finds the brute-force best', () => {
    let best = -Infinity;
    let arg: number[] = [];
    for (let i = 0; i < 41; i++) for (let j = i; j < 41; j++) if (ld([i, j]) > best) { best = ld([i, j]); arg = [i, j]; }
    const e = exactDesign(rows, 2)!;
    expect(e.logDet).toBeCloseTo(best, 10);
    expect(e.indices.slice().sort((a, b) => a - b)).toEqual(arg);
  });
  test('every 3-point design (with repeats): the exchange finds the brute-force best', () => {
    let best = -Infinity;
    for (let i = 0; i < 41; i++) for (let j = i; j < 41; j++) for (let k = j; k < 41; k++) best = Math.max(best, ld([i, j, k]));
    expect(exactDesign(rows, 3)!.logDet).toBeCloseTo(best, 10);
  });
  test('6 runs under the session rules (reference pair, 4 distinct flows, a replicate) on 7 candidate flows: the exchange finds the brute-force best', () => {
    const few = [0, 5, 10, 15, 20, 30, 40];
    const sub = few.map((i) => rows[i]);
    const ok = (idx: number[]) => {
      const counts = new Map<number, number>();
      idx.forEach((i) => counts.set(i, (counts.get(i) ?? 0) + 1));
      return counts.size >= 4 && [...counts].some(([i, c]) => c >= (i === idx[0] ? 3 : 2));
    };
    let best = -Infinity;
    for (let ref = 0; ref < 7; ref++) {
      for (let a = 0; a < 7; a++) for (let b = a; b < 7; b++) for (let c = b; c < 7; c++) for (let d = c; d < 7; d++) {
        const idx = [ref, a, b, c, d, ref];
        if (ok(idx)) best = Math.max(best, logDet(informationMatrix(idx.map((i) => sub[i]), 2), 2));
      }
    }
    const e = exactDesign(sub, 6, { referencePair: true, minDistinct: 4, requireReplicate: true })!;
    expect(e.indices[0]).toBe(e.indices[5]);
    expect(ok(e.indices)).toBe(true);
    expect(e.logDet).toBeCloseTo(best, 10);
  });
  test('rules that cannot be met → null', () => {
    expect(exactDesign(rows.slice(0, 3), 6, { minDistinct: 4 })).toBeNull();
  });
});

describe('information-matrix helpers (closed forms)', () => {
  test('the inverse of [[2, 1], [1, 1]] is [[1, −1], [−1, 2]] and log det is 0', () => {
    expect(Array.from(symmetricInverse(Float64Array.of(2, 1, 1, 1), 2)!)).toEqual([1, -1, -1, 2].map((v) => expect.closeTo(v, 14)));
    expect(logDet(Float64Array.of(2, 1, 1, 1), 2)).toBeCloseTo(0, 14);
    expect(logDet(Float64Array.of(1, 1, 1, 1), 2)).toBe(-Infinity);
  });
});
