import { describe, expect, test } from 'vitest';
import { collectorOutlet, collectorPowerW, type CollectorParameters } from '../../../analysis/performance/collector-efficiency';
import { collectorTest, type CollectorTrial } from '../../../analysis/performance/collector-test';
import { collectorSteadiness, ISO9806_STEADY_LIMITS } from '../../../analysis/performance/collector-steadiness';
import { run } from '../../../analysis/cli/collector';
import { InputError } from '../../../analysis/units/reading-input';
import { normalStream } from '../../support/seeded-normals';

// Solar Keymark data sheet DS 3663 (ISO 9806:2017, gross area 2.02 m²), DOMAIN.md §4 and check value #14 [16]
const DS3663: CollectorParameters = { areaM2: 2.02, areaBasis: 'gross', peakPowerW: 1480, a1WPerM2K: 3.51, a2WPerM2K2: 0.017 };
const CP = 4186;

/**
 * Trials made from a known curve: for each inlet and irradiance the outlet solves the steady balance
 * ṁ·cp·(Tout − Tin) = A·(η0·G − a1·x − a2·x²), x = Tm − Ta (collectorOutlet). Four inlet temperatures,
 * the first near ambient, four points each, 0.02 kg/(s·m²) — the ISO 9806-1:1994 plan of DOMAIN.md §2.4 [11].
 */
function trialsFrom(p: CollectorParameters, noiseK = 0, z = normalStream(1), G: number[] = [850, 900, 950, 1000]): CollectorTrial[] {
  const m = 0.02 * p.areaM2;
  const out: CollectorTrial[] = [];
  for (const tin of [22, 40, 60, 80]) {
    for (const g of G) {
      const o = collectorOutlet(p, { inletTempC: tin, ambientTempC: 21, irradianceWPerM2: g, massFlowKgPerS: m, cpJPerKgK: CP });
      out.push({ irradianceWPerM2: g, inletTempC: tin, outletTempC: o.outletTempC + noiseK * z(), ambientTempC: 21, massFlowKgPerS: m });
    }
  }
  return out;
}

describe('collector efficiency test, ISO 9806 steady-state form (DOMAIN.md §4)', () => {
  test('recovers the DS 3663 coefficients exactly from trials made from its curve, and the fitted curve gives check value #14: 1,236 W at ΔT 30 K (datasheet 1,235 W) [16]', () => {
    const r = collectorTest({ trials: trialsFrom(DS3663), areaM2: 2.02, areaBasis: 'gross', fluid: { cpJPerKgK: CP } });
    if (!r.ok) throw new Error(r.reason);
    expect(r.eta0.value).toBeCloseTo(1480 / 2020, 12); // η0 = P0/(A·G*), EN 12975 power curve [14]
    expect(r.a1WPerM2K.value).toBeCloseTo(3.51, 10);
    expect(r.a2WPerM2K2.value).toBeCloseTo(0.017, 12);
    expect(r.r2).toBeCloseTo(1, 12);
    expect(r.n).toBe(16);
    expect(r.areaBasis).toBe('gross');
    expect(r.warnings).toEqual([]);
    expect(collectorPowerW(r.parameters!, 30)).toBeCloseTo(1236.4, 1); // DOMAIN.md §4 (computed)
    expect(Math.abs(collectorPowerW(r.parameters!, 30) / 1235 - 1)).toBeLessThan(0.002); // the datasheet's listed power
  });

  test('η, x and Tm follow the definitions: η = ṁ·cp·ΔT/(A·G), x = (Tm − Ta)/G with Tm the mean of inlet and outlet (ISO 9806 [13b])', () => {
    const trials = trialsFrom(DS3663);
    const r = collectorTest({ trials, areaM2: 2.02, areaBasis: 'gross', fluid: { cpJPerKgK: CP } });
    if (!r.ok) throw new Error(r.reason);
    const t = trials[5];
    const pt = r.points[5];
    expect(pt.efficiency).toBeCloseTo((t.massFlowKgPerS! * CP * (t.outletTempC - t.inletTempC)) / (2.02 * t.irradianceWPerM2), 14);
    expect(pt.meanTempC).toBeCloseTo((t.inletTempC + t.outletTempC) / 2, 14);
    expect(pt.xM2KPerW).toBeCloseTo((pt.meanTempC - 21) / t.irradianceWPerM2, 14);
  });

  test('with noise on the outlet, the 95 % intervals of η0, a1 and a2 cover the true values at close to the nominal rate (400 seeded datasets; binomial tolerance 3σ ≈ 3.3 %)', () => {
    // Gaussian noise at one irradiance is homoscedastic in η, so the t intervals are exact (common practice)
    const truth = { eta0: 1480 / 2020, a1: 3.51, a2: 0.017 };
    const reps = 400;
    const hits = { eta0: 0, a1: 0, a2: 0 };
    const z = normalStream(2024);
    for (let k = 0; k < reps; k++) {
      const r = collectorTest({ trials: trialsFrom(DS3663, 0.05, z, [950, 950]), areaM2: 2.02, areaBasis: 'gross', fluid: { cpJPerKgK: CP } });
      if (!r.ok) throw new Error(r.reason);
      if (r.eta0.ciLow <= truth.eta0 && truth.eta0 <= r.eta0.ciHigh) hits.eta0++;
      if (r.a1WPerM2K.ciLow <= truth.a1 && truth.a1 <= r.a1WPerM2K.ciHigh) hits.a1++;
      if (r.a2WPerM2K2.ciLow <= truth.a2 && truth.a2 <= r.a2WPerM2K2.ciHigh) hits.a2++;
    }
    const tol = 3 * Math.sqrt((0.95 * 0.05) / reps);
    for (const h of Object.values(hits)) expect(Math.abs(h / reps - 0.95)).toBeLessThan(tol);
  });

  test('the band is the delta-method interval of the curve: at x = 0 it is η0 ± t·se(η0) (computed)', () => {
    const r = collectorTest({ trials: trialsFrom(DS3663, 0.05, normalStream(3)), areaM2: 2.02, areaBasis: 'gross', fluid: { cpJPerKgK: CP } });
    if (!r.ok) throw new Error(r.reason);
    const b0 = r.band.find((b) => b.xM2KPerW === 0)!;
    expect(b0.efficiency).toBeCloseTo(r.eta0.value, 14);
    expect(b0.ciHigh - b0.efficiency).toBeCloseTo(r.eta0.ciHigh - r.eta0.value, 12);
    expect(b0.extrapolated).toBe(true);
    const last = r.band[r.band.length - 1];
    expect(last.xM2KPerW).toBeCloseTo(r.xRangeM2KPerW[1], 14);
    expect(last.ciHigh - last.ciLow).toBeGreaterThan(0);
    expect(r.residualSD).toBeGreaterThan(0);
    expect(r.points.map((p) => p.residual).reduce((a, b) => a + b, 0)).toBeCloseTo(0, 10); // an intercept: residuals sum to 0
  });

  test('weights are 1/u²(η) with relative uncertainties of ΔT, flow and G in quadrature (GUM, DOMAIN.md §2.5)', () => {
    const trials = trialsFrom(DS3663, 0.05, normalStream(5));
    const r = collectorTest({ trials, areaM2: 2.02, areaBasis: 'gross', fluid: { cpJPerKgK: CP }, uncertainty: { temperatureDifferenceK: 0.05, flowRelative: 0.005, irradianceRelative: 0.015 } });
    if (!r.ok) throw new Error(r.reason);
    expect(r.weighted).toBe(true);
    const p = r.points[0];
    const dT = trials[0].outletTempC - trials[0].inletTempC;
    expect(p.efficiencyU!).toBeCloseTo(p.efficiency * Math.hypot(0.05 / dT, 0.005, 0.015), 14);
  });

  test('the first-order form fixes a2 = 0 and fits two coefficients', () => {
    const first: CollectorParameters = { areaM2: 2, eta0: 0.8, a1WPerM2K: 4, a2WPerM2K2: 0 };
    const r = collectorTest({ trials: trialsFrom(first), areaM2: 2, areaBasis: 'aperture', fluid: { cpJPerKgK: CP }, order: 1 });
    if (!r.ok) throw new Error(r.reason);
    expect(r.parameterNames).toEqual(['eta0', 'a1']);
    expect(r.a1WPerM2K.value).toBeCloseTo(4, 10);
    expect(r.a2WPerM2K2).toEqual({ value: 0, stdErr: 0, ciLow: 0, ciHigh: 0 });
  });
});

describe('steadiness limits (ISO 9806-1:1994 as described in DOMAIN.md §2.4 [11]; deviations from memory)', () => {
  test('the limits are the ones DOMAIN.md §2.4 lists', () => {
    expect(ISO9806_STEADY_LIMITS).toMatchObject({ irradianceDeviationWPerM2: 50, ambientDeviationK: 1.5, flowDeviationRelative: 0.01, inletDeviationK: 0.1, minTemperatureRiseK: 1.5, minIrradianceWPerM2: 800 });
  });
  test('a trial whose spread exceeds a permitted deviation, or whose rise is under 1.5 K, is excluded with its reason', () => {
    const trials = trialsFrom(DS3663);
    trials[3] = { ...trials[3], spread: { irradianceWPerM2: 60 } };
    trials[7] = { ...trials[7], spread: { flowRelative: 0.02, inletTempK: 0.05 } };
    trials[9] = { ...trials[9], outletTempC: trials[9].inletTempC + 1 };
    trials[10] = { ...trials[10], spread: { irradianceWPerM2: 40, ambientTempK: 1, inletTempK: 0.08, flowRelative: 0.008 } }; // within every limit
    const r = collectorTest({ trials, areaM2: 2.02, areaBasis: 'gross', fluid: { cpJPerKgK: CP } });
    if (!r.ok) throw new Error(r.reason);
    expect(r.excluded.map((e) => e.index)).toEqual([3, 7, 9]);
    expect(r.excluded[0].reasons[0]).toMatch(/irradiance varied by 60/);
    expect(r.excluded[1].reasons[0]).toMatch(/flow varied by 2.00 %/);
    expect(r.excluded[2].reasons[0]).toMatch(/temperature rise 1.00 K/);
    expect(r.n).toBe(13);
    expect(r.a1WPerM2K.value).toBeCloseTo(3.51, 9);
  });
  test('test conditions outside the standard give warnings, not exclusions', () => {
    const base = { inletTempC: 25, outletTempC: 31, ambientTempC: 22, flow: 3.3e-5 };
    const w = collectorSteadiness([{ ...base, irradianceWPerM2: 700, windMPerS: 6 }, { ...base, irradianceWPerM2: 950, flow: 5e-5 }]);
    expect(w.reasons).toEqual([[], []]);
    expect(w.warnings.join(' | ')).toMatch(/below the 800 W\/m²/);
    expect(w.warnings.join(' | ')).toMatch(/2–4 m\/s wind/);
    expect(w.warnings.join(' | ')).toMatch(/more than 10 % from the median/);
    expect(w.warnings.join(' | ')).toMatch(/only 1 distinct inlet/);
  });
});

describe('tests that cannot give a curve', () => {
  test('too few valid trials → ok: false', () => {
    const r = collectorTest({ trials: trialsFrom(DS3663).slice(0, 3), areaM2: 2.02, areaBasis: 'gross' });
    expect(r).toMatchObject({ ok: false, reason: expect.stringMatching(/at least 4/) });
  });
  test('every trial at one inlet temperature and irradiance (a degenerate spread of x) → ok: false', () => {
    const one = trialsFrom(DS3663).slice(0, 4).map((t) => ({ ...t, irradianceWPerM2: 950 }));
    const r = collectorTest({ trials: [...one, ...one], areaM2: 2.02, areaBasis: 'gross' });
    expect(r).toMatchObject({ ok: false, reason: expect.stringMatching(/too few mean-temperature excesses/) });
  });
  test.each([
    [{ areaM2: 0 }, /areaM2/],
    [{ areaBasis: 'absorber' }, /areaBasis/],
    [{ trials: [] }, /trials/],
    [{ trials: [{ irradianceWPerM2: 0, inletTempC: 25, outletTempC: 31, ambientTempC: 22, flowM3PerS: 3e-5 }] }, /trials\[0\]\.irradianceWPerM2/],
    [{ trials: [{ irradianceWPerM2: 950, inletTempC: 25, outletTempC: 31, ambientTempC: 22 }] }, /trials\[0\]\.flowM3PerS or/],
    [{ level: 1.5 }, /level/],
  ])('malformed input %j throws naming the field', (patch, msg) => {
    expect(() => collectorTest({ trials: trialsFrom(DS3663), areaM2: 2.02, areaBasis: 'gross', ...patch } as never)).toThrow(msg);
  });
});

describe('collector command', () => {
  const trial = (tin: number, tout: number, g = 950) => ({ irradiance: `${g} W/m^2`, inletTemp: `${tin} degC`, outletTemp: `${tout} degC`, ambientTemp: '22 degC', flow: '2.4 L/min' });
  const contract = {
    grossArea: '2 m^2', apertureArea: '1.8 m^2',
    trials: [trial(22.5, 30.1), trial(22.6, 30.3, 990), trial(40, 46.9), trial(40.1, 47.3, 1000), trial(60, 66.1), trial(60.2, 66.5, 1010), trial(80, 84.8), trial(80.1, 85.3, 1020)],
  };
  test('prints the contract fields with the covariance and the area basis; the aperture coefficients are the gross ones × A_gross/A_aperture', () => {
    const r = run(contract) as Record<string, any>;
    expect(r.ok).toBe(true);
    for (const k of ['eta0', 'a1_W_per_m2K', 'a2_W_per_m2K2']) expect(Object.keys(r[k])).toEqual(['value', 'stdErr', 'ciLow', 'ciHigh']);
    expect(r.n).toBe(8);
    expect(r.covariance).toHaveLength(3);
    expect(r.areaBasis).toBe('gross');
    expect(r.otherBasis.eta0.value).toBeCloseTo((r.eta0.value * 2) / 1.8, 12);
    expect(r.warnings.join(' ')).toMatch(/at least 16/);
    expect(JSON.stringify(r)).not.toMatch(/NaN|null,"stdErr"/);
  });
  test('too few trials is a result: {ok: false, reason}', () => {
    expect(run({ ...contract, trials: contract.trials.slice(0, 2) })).toMatchObject({ ok: false });
  });
  test.each([
    [{ ...contract, grossArea: undefined, apertureArea: undefined }, /grossArea or apertureArea/],
    [{ ...contract, trials: [{ ...contract.trials[0], flow: '2 kg' }] }, /trials\[0\]\.flow/],
    [{ ...contract, trials: 'many' }, /trials must be an array/],
    [{ ...contract, order: 3 }, /order/],
  ])('malformed input %# is an InputError naming the field', (input, msg) => {
    expect(() => run(input)).toThrow(InputError);
    expect(() => run(input)).toThrow(msg);
  });
});
