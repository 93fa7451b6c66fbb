import { describe, expect, test } from 'vitest';
import { bucketFlow } from '../../../analysis/trial/bucket-flow';
import { deriveTrial } from '../../../analysis/trial/derive-trial';
import { gumBudget, rectangularU, certificateU } from '../../../analysis/trial/gum-budget';
import { heatRateBudget } from '../../../analysis/trial/heat-rate-budget';
import { convert } from '../../../analysis/units/parse-quantity';

const GAL = 3.785411784e-3;

describe('bucket flow', () => {
  test('five gallons filled in 124 s is 2.42 gpm (common practice)', () => {
    const f = bucketFlow(5 * GAL, [124]);
    expect(convert(f.flowM3PerS, 'm^3/s', 'gpm')).toBeCloseTo(2.42, 2);
    expect(f.typeAUncertaintyS).toBe(0);
  });
  test('three fills: mean 75.00 s, s 0.361 s, Type A u 0.208 s (DOMAIN.md §2.5, computed)', () => {
    const f = bucketFlow(0.01893, [74.6, 75.3, 75.1]);
    expect(f.meanTimeS).toBeCloseTo(75.0, 10);
    expect(f.sdTimeS).toBeCloseTo(0.361, 3);
    expect(f.typeAUncertaintyS).toBeCloseTo(0.208, 3);
    expect(f.flowM3PerS * 60000).toBeCloseTo(15.14, 2);
    expect(f.dof).toBe(2);
  });
  test.each([
    [0, [10], /bucketVolumeM3/],
    [-1, [10], /bucketVolumeM3/],
    [1, [], /fillTimesS/],
    [1, [10, 0], /fillTimesS\[1\]/],
  ])('refuses volume %s with times %j', (v, t, msg) => {
    expect(() => bucketFlow(v, t)).toThrow(RangeError);
    expect(() => bucketFlow(v, t)).toThrow(msg);
  });
  test('NaN time is a TypeError', () => expect(() => bucketFlow(1, [Number.NaN])).toThrow(TypeError));
});

describe('deriveTrial', () => {
  test('mass flow uses the density of the bucket (outlet) water; q = ṁ cp ΔT', () => {
    const d = deriveTrial({ flowM3PerS: 0.2524e-3, inletTempC: 15, outletTempC: 35 });
    expect(d.densityKgPerM3).toBeCloseTo(994.0, 1); // DOMAIN.md §1.1 (standard water tables, from memory)
    expect(d.deltaTK).toBe(20);
    expect(d.heatW).toBeCloseTo(d.massFlowKgPerS * d.cpJPerKgK * 20, 9);
    expect(d.heatW / 1000).toBeCloseTo(20.98, 1);
    expect(d.effectiveness).toBeNull();
    expect(d.cautions).toEqual([]);
  });
  test('effectiveness and UA with a known source reproduce check value #2 (ε-NTU, computed)', () => {
    const d = deriveTrial({ flowM3PerS: 0.1 / 1000, inletTempC: 20, outletTempC: 68.80, sourceTempC: 90, densityKgPerM3: 1000, cpJPerKgK: 4186 });
    expect(d.effectiveness!).toBeCloseTo(0.6971, 4);
    expect(d.uaWPerK!).toBeCloseTo(500, 0);
    expect(d.cautions.map((c) => c.code)).toEqual(['scald-seconds', 'scald', 'spa-limit']);
  });
  test('outlet below inlet is refused as inconsistent, naming the field', () => {
    expect(() => deriveTrial({ flowM3PerS: 1e-4, inletTempC: 30, outletTempC: 25 })).toThrow(/outletTempC.*inconsistent/);
  });
  test('a temperature outside the water formulation is refused', () => {
    expect(() => deriveTrial({ flowM3PerS: 1e-4, inletTempC: 20, outletTempC: 120 })).toThrow(/outletTempC/);
  });
  test('zero flow through a heated coil carries the dead-heading caution', () => {
    const d = deriveTrial({ flowM3PerS: 0, inletTempC: 20, outletTempC: 20 });
    expect(d.cautions.map((c) => c.code)).toContain('dead-heading');
    expect(d.heatW).toBe(0);
  });
});

describe('GUM budget (JCGM 100:2008 / NIST TN 1297)', () => {
  test('a product: relative uncertainties add in quadrature', () => {
    const b = gumBudget(([a, c]) => a * c, [{ name: 'a', value: 2, u: 0.1 }, { name: 'c', value: 3, u: 0.2 }], { k: 2 });
    expect(b.uc).toBeCloseTo(Math.sqrt((3 * 0.1) ** 2 + (2 * 0.2) ** 2), 10);
    expect(b.rows[0].percent + b.rows[1].percent).toBeCloseTo(100, 10);
    expect(b.U).toBeCloseTo(2 * b.uc, 12);
  });
  test('Welch–Satterthwaite: one Type A input with ν = 4 alone gives ν_eff = 4 and k = t(0.975, 4) = 2.776', () => {
    const b = gumBudget(([a]) => 3 * a, [{ name: 'a', value: 1, u: 0.1, dof: 4 }]);
    expect(b.nuEff).toBeCloseTo(4, 6);
    expect(b.k).toBeCloseTo(2.776, 3); // Student t table (NIST/SEMATECH e-Handbook 1.3.6.7.2)
  });
  test('rectangular a/√3 and certificate U/k conventions', () => {
    expect(rectangularU(1)).toBeCloseTo(0.57735, 5);
    expect(certificateU(0.2, 2)).toBe(0.1);
  });
  test('refuses a correlation between unknown inputs and |r| > 1', () => {
    const inputs = [{ name: 'a', value: 1, u: 0.1 }, { name: 'b', value: 1, u: 0.1 }];
    expect(() => gumBudget(([a, b]) => a + b, inputs, { correlations: [{ a: 'a', b: 'z', r: 0.5 }] })).toThrow(RangeError);
    expect(() => gumBudget(([a, b]) => a + b, inputs, { correlations: [{ a: 'a', b: 'b', r: 1.5 }] })).toThrow(/correlation a–b/);
    expect(() => gumBudget(([a]) => a, [{ name: 'a', value: 1, u: -1 }])).toThrow(/inputs\[0\]\.u/);
  });
});

describe('bucket-test heat-rate budget, check value #12 (DOMAIN.md §2.5, GUM worked example, computed)', () => {
  const base = {
    bucketVolumeM3: 18.93e-3, volumeHalfWidthM3: 0.25e-3, fillTimesS: [74.6, 75.3, 75.1],
    inletTempC: 15, outletTempC: 35, sensorHalfWidthK: 1.0, densityKgPerM3: 994.0, cpJPerKgK: 4180,
  };
  test('independent sensors: q 20.97 kW, u_rel 4.17 %, U(k = 2) 1.75 kW', () => {
    const b = heatRateBudget({ ...base, k: 2 });
    expect(b.heat.value / 1000).toBeCloseTo(20.97, 2);
    expect(b.heat.ucRelative * 100).toBeCloseTo(4.17, 2);
    expect(b.heat.U / 1000).toBeCloseTo(1.75, 2);
    expect(b.flow.value * 1000).toBeCloseTo(0.2524, 4);
    // combined u(t) = 0.252 s (0.34 %), u(V) 0.76 %
    const uT = Math.hypot(b.flow.rows[1].u, b.flow.rows[2].u);
    expect(uT).toBeCloseTo(0.252, 3);
    expect(b.flow.rows[0].u / 18.93e-3 * 100).toBeCloseTo(0.76, 2);
    // the ΔT terms dominate
    const tempShare = b.heat.rows.filter((r) => r.name.includes('temperature')).reduce((s, r) => s + r.percent, 0);
    expect(tempShare).toBeGreaterThan(95);
  });
  test('cross-calibrated sensors, r = 0.8: u_rel 2.01 %, U 0.84 kW', () => {
    const b = heatRateBudget({ ...base, k: 2, sensorCorrelation: 0.8 });
    expect(b.heat.ucRelative * 100).toBeCloseTo(2.01, 2);
    expect(b.heat.U / 1000).toBeCloseTo(0.84, 2);
    expect(b.heat.rows.some((r) => r.distribution === 'correlation' && r.percent < 0)).toBe(true);
  });
  test('k from ν_eff: the Type A fill time has ν = 2 but a tiny share, so ν_eff is large and k ≈ 1.96', () => {
    const b = heatRateBudget(base);
    expect(b.heat.nuEff).toBeGreaterThan(1000);
    expect(b.heat.k).toBeCloseTo(1.96, 2);
  });
  test('outlet below inlet is refused', () => {
    expect(() => heatRateBudget({ ...base, inletTempC: 40 })).toThrow(/inconsistent/);
  });
});
