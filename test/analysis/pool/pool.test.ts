import { describe, expect, test } from 'vitest';
import { poolGeometry } from '../../../analysis/pool/pool-geometry';
import { doeHeaterSizing, fiveHundredRuleBtuPerH, tradeRuleGallons, TRADE_BTU_PER_GAL_PER_DEGF } from '../../../analysis/pool/trade-rules';
import { energyPerDegreeJPerK, heatUpRateKPerH } from '../../../analysis/pool/energy-per-degree';
import { mixingSession, mixTemperatureC, risePerHourTable, volumeWeightedTempC } from '../../../analysis/pool/mixing';
import { fillTub } from '../../../analysis/pool/fill-tub';
import { coilHeater, fixedRiseHeater } from '../../../analysis/performance/heater-model';
import { convert } from '../../../analysis/units/parse-quantity';

const FT = 0.3048;
const toGal = (m3: number) => convert(m3, 'm^3', 'gal');
const fToC = (f: number) => (f - 32) / 1.8;

describe('pool volumes (DOMAIN.md §3.1)', () => {
  test('check value #5: round 15 ft × 4 ft → 5,288 gal exact; trade rule 5,310 gal ([42], common practice)', () => {
    const g = poolGeometry({ shape: 'round', diameterM: 15 * FT, depthM: 4 * FT });
    expect(toGal(g.volumeM3)).toBeCloseTo(5288, 0);
    expect(tradeRuleGallons('round', [15], 4)).toBeCloseTo(5310, 6);
  });
  test('check value #6: rectangle 20 × 40 ft, 3–8 ft deep → 32,914 gal exact; rule 33,000 gal ([42])', () => {
    const g = poolGeometry({ shape: 'rectangle', lengthM: 40 * FT, widthM: 20 * FT, shallowDepthM: 3 * FT, deepDepthM: 8 * FT });
    expect(toGal(g.volumeM3)).toBeCloseTo(32914, 0);
    expect(g.meanDepthM / FT).toBeCloseTo(5.5, 12);
    expect(tradeRuleGallons('rectangle', [20, 40], 5.5)).toBeCloseTo(33000, 6);
    expect(g.notes.join(' ')).toMatch(/uniform slope/);
  });
  test('15 × 30 × 4 ft: stadium 12,020 gal, ellipse 10,575 gal (DOMAIN.md §3.1, computed)', () => {
    const st = poolGeometry({ shape: 'stadium', lengthM: 30 * FT, widthM: 15 * FT, depthM: 4 * FT });
    const el = poolGeometry({ shape: 'ellipse', lengthM: 30 * FT, widthM: 15 * FT, depthM: 4 * FT });
    expect(toGal(st.volumeM3)).toBeCloseTo(12020, -1);
    expect(toGal(el.volumeM3)).toBeCloseTo(10575, -1);
  });
  test('kidney uses the trade area rule 0.45·(A + B)·L ([42c], common practice)', () => {
    const g = poolGeometry({ shape: 'kidney', widthM: 10 * FT, width2M: 14 * FT, lengthM: 30 * FT, depthM: 4.5 * FT });
    expect(toGal(g.volumeM3)).toBeCloseTo(tradeRuleGallons('kidney', [10, 14, 30], 4.5) * (7.48051948 / 7.5), 0);
    expect(g.volumeMethod).toBe('trade rule');
  });
  test('an entered (metered) volume replaces the computed one', () => {
    const g = poolGeometry({ shape: 'round', diameterM: 5, enteredVolumeM3: 21 });
    expect(g.volumeM3).toBe(21);
    expect(g.volumeMethod).toBe('entered');
  });
  test.each([
    [{ shape: 'round', depthM: 1 }, /diameterM/],
    [{ shape: 'round', diameterM: -4, depthM: 1 }, /diameterM/],
    [{ shape: 'rectangle', lengthM: 10, widthM: 5 }, /depthM/],
    [{ shape: 'rectangle', lengthM: 10, widthM: 5, depthM: 1, shallowDepthM: 1 }, /either depthM/],
    [{ shape: 'hexagon', lengthM: 10, depthM: 1 }, /shape/],
    [{ shape: 'round', diameterM: 5, enteredVolumeM3: -3 }, /enteredVolumeM3/],
  ] as const)('refuses %j', (dims, msg) => {
    expect(() => poolGeometry(dims as never)).toThrow(msg);
  });
});

describe('energy per degree and heat-up rate (DOMAIN.md §3.2)', () => {
  test('check value #8: 15,000 gal → 124,950 Btu per °F by the 8.33 rule; IF97 at 60–80 °F within 0.2 % ([1b, 24])', () => {
    expect(15000 * TRADE_BTU_PER_GAL_PER_DEGF).toBeCloseTo(124950, 6);
    const jPerK = energyPerDegreeJPerK(15000 * 3.785411784e-3, fToC(70));
    const btuPerF = convert(jPerK / 1.8, 'J', 'Btu');
    expect(Math.abs(btuPerF / 124950 - 1)).toBeLessThan(2e-3);
  });
  test('100,000 Btu/h into 10,000 gal → 1.20 °F/h loss-free (DOMAIN.md §3.2, computed)', () => {
    const kPerH = heatUpRateKPerH(convert(100000, 'Btu/h', 'W'), 10000 * 3.785411784e-3, fToC(80));
    expect(kPerH * 1.8).toBeCloseTo(1.2, 2);
  });
  test('400 gal needs 3,332 Btu per °F by the 8.33 rule (DOMAIN.md §3.7); IF97 at 60 °F agrees within 0.2 %', () => {
    expect(400 * TRADE_BTU_PER_GAL_PER_DEGF).toBeCloseTo(3332, 9);
    const btuPerF = convert(energyPerDegreeJPerK(400 * 3.785411784e-3, fToC(60)) / 1.8, 'J', 'Btu');
    expect(Math.abs(btuPerF / 3332 - 1)).toBeLessThan(2e-3);
    // at spa temperature the water is lighter: 0.7 % less at 100 °F
    expect(convert(energyPerDegreeJPerK(400 * 3.785411784e-3, fToC(100)) / 1.8, 'J', 'Btu')).toBeLessThan(btuPerF);
  });
  test('check value #1: 10 gpm × 20 °F → 100,000 Btu/h by the 500 rule (hydronic common practice [44])', () => {
    expect(fiveHundredRuleBtuPerH(10, 20)).toBe(100000);
    // and 99,960 Btu/h with 8.33 lb/gal × 60 min/h
    expect(fiveHundredRuleBtuPerH(10, 20, 8.33 * 60)).toBeCloseTo(99960, 6);
  });
  test('check value #9: DOE sizing, 720 ft², ΔT 25 °F → 216,000 Btu/h ([1], example [43])', () => {
    const r = doeHeaterSizing(720 * FT * FT, fToC(75), fToC(50));
    expect(r.outputBtuPerH).toBeCloseTo(216000, 4);
    expect(() => doeHeaterSizing(10, 10, 20)).toThrow(/targetC/);
  });
});

describe('mixing (DOMAIN.md §3.3)', () => {
  test('check value #7: 100 L at 60 °C + 1,000 L at 20 °C → 23.64 °C by the volume-weighted rule (computed); 23.58 °C by mass and enthalpy', () => {
    const parts = [{ volumeM3: 0.1, tempC: 60 }, { volumeM3: 1, tempC: 20 }];
    expect(volumeWeightedTempC(parts)).toBeCloseTo(23.64, 2);
    // the hot 100 L weigh 98.3 kg, not 100 kg (IF97 ρ(60 °C) = 983.2 kg/m³), so its share of the mixture is smaller
    expect(mixTemperatureC(parts)).toBeCloseTo(23.58, 2);
  });
  test('900 gal at 116 °F into 11,100 gal at 73 °F → 76.23 °F, rise 3.23 °F, 0.54 °F/h over six hours (common practice)', () => {
    const gal = 3.785411784e-3;
    const s = mixingSession({
      poolVolumeM3: 12000 * gal, poolTempC: fToC(73), flowM3PerS: (2.5 * gal) / 60, hours: 6, outletTempC: fToC(116),
    });
    expect(s.heatedVolumeM3 / gal).toBeCloseTo(900, 9);
    // quoted as 76.23 °F and 3.23 °F: the volume-weighted values are 76.225 and 3.225
    expect(s.volumeWeightedTempC * 1.8 + 32).toBeCloseTo(76.225, 9);
    // the heated water is drawn from the pool, so both masses are at the pool's density: by enthalpy only cp differs
    expect(Math.abs(s.finalTempC * 1.8 + 32 - 76.225)).toBeLessThan(0.01);
    expect(s.riseK * 1.8).toBeCloseTo(3.22, 2);
    expect(s.risePerHourK * 1.8).toBeCloseTo(0.54, 2);
    expect(s.cautions.map((c) => c.code)).toEqual(['spa-limit']); // 116 °F outlet is 46.7 °C
  });
  test('a session that would pass more than the pool through the heater is refused', () => {
    expect(() => mixingSession({ poolVolumeM3: 1, poolTempC: 20, flowM3PerS: 1e-3, hours: 1, outletTempC: 30 })).toThrow(/recirculating/);
  });
  test('rise-per-hour table: rows by flow, columns by pool size', () => {
    const t = risePerHourTable(fixedRiseHeater(10), [1e-4, 2e-4], [10, 20], 20);
    expect(t[0][0]).toBeCloseTo(0.36, 12);
    expect(t[1][1]).toBeCloseTo(0.36, 12);
    expect(t[1][0]).toBeCloseTo(0.72, 12);
  });
  test('negative volumes are refused naming the part', () => {
    expect(() => mixTemperatureC([{ volumeM3: -1, tempC: 20 }])).toThrow(/parts\[0\]\.volumeM3/);
    expect(() => mixTemperatureC([{ volumeM3: 0, tempC: 20 }])).toThrow(RangeError);
  });
});

describe('fill mode', () => {
  test('a coil filling a tub: fill time V/V̇, final temperature = outlet temperature, spa caution above 40 °C', () => {
    const heater = coilHeater({ sourceTempC: 90, uaWPerK: 500, cpJPerKgK: 4186, densityKgPerM3: 1000 });
    const r = fillTub({ heater, tubVolumeM3: 1.5, flowM3PerS: 1e-4, supplyTempC: 20 });
    expect(r.fillTimeS).toBeCloseTo(15000, 9);
    expect(r.outletTempC).toBeCloseTo(68.8, 2); // check value #2
    expect(r.finalTempC).toBeCloseTo(68.8, 2);
    expect(r.cautions.map((c) => `${c.code}@${c.where}`)).toContain('spa-limit@tub');
  });
  test('mixes with water already in the tub', () => {
    const r = fillTub({ heater: fixedRiseHeater(20), tubVolumeM3: 1, flowM3PerS: 1e-4, supplyTempC: 20, initialVolumeM3: 1, initialTempC: 30 });
    expect(r.finalTempC).toBeCloseTo(mixTemperatureC([{ volumeM3: 1, tempC: 40 }, { volumeM3: 1, tempC: 30 }]), 12);
    expect(Math.abs(r.finalTempC - 35)).toBeLessThan(0.02); // the volume-weighted rule of thumb
  });
  test('zero flow is refused with the dead-heading message', () => {
    expect(() => fillTub({ heater: fixedRiseHeater(20), tubVolumeM3: 1, flowM3PerS: 0, supplyTempC: 20 })).toThrow(/boiler/);
  });
});
