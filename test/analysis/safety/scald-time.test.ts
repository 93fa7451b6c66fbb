import { describe, expect, test } from 'vitest';
import { SCALD_TIME_TABLE, scaldTime } from '../../../analysis/safety/scald-time';
import { temperatureCautions } from '../../../analysis/safety/cautions';

const fToC = (f: number) => (f - 32) / 1.8;

describe('time to a serious scald (DOMAIN.md §5, children\'s hospital table [39])', () => {
  test.each([
    // °F, qualifier, shortest s, longest s, text — every row of the published table [39]
    [120, 'longer-than', 300, null, 'longer than 5 min'],
    [125, 'range', 90, 120, '1.5–2 min'],
    [130, 'about', 30, 30, '30 s'],
    [135, 'about', 10, 10, '10 s'],
    [140, 'shorter-than', null, 5, 'shorter than 5 s'],
    [145, 'shorter-than', null, 3, 'shorter than 3 s'],
    [150, 'about', 1.5, 1.5, '1.5 s'],
    [155, 'about', 1, 1, '1 s'],
  ] as const)('%s °F reads the table row: %s %s–%s s (%s)', (f, qualifier, lowS, highS, text) => {
    const r = scaldTime(fToC(f));
    expect(r).toMatchObject({ qualifier, lowS, highS, text, interpolated: false, outsideTable: false });
  });
  test('check value #18: 140 °F < 5 s, 130 °F 30 s, 120 °F > 5 min [39]', () => {
    expect(scaldTime(60)).toMatchObject({ qualifier: 'shorter-than', seconds: 5 });
    expect(scaldTime(fToC(130))).toMatchObject({ qualifier: 'about', seconds: 30 });
    expect(scaldTime(fToC(120))).toMatchObject({ qualifier: 'longer-than', seconds: 300 });
  });
  test('between rows ln t is linear in temperature: 132.5 °F is √(30·10) s (computed from [39])', () => {
    const r = scaldTime(fToC(132.5));
    expect(r.seconds).toBeCloseTo(Math.sqrt(300), 12);
    expect(r).toMatchObject({ qualifier: 'about', interpolated: true, text: 'about 17 s' });
  });
  test('each end of a range is interpolated: 122.5 °F lies between > 5 min and 1.5–2 min (computed from [39])', () => {
    const r = scaldTime(fToC(122.5));
    expect(r.lowS!).toBeCloseTo(Math.sqrt(300 * 90), 9);
    expect(r.highS!).toBeCloseTo(Math.sqrt(300 * 120), 9);
    expect(r.qualifier).toBe('range');
  });
  test('a bound shared by both neighbours carries over: 142.5 °F is shorter than √(5·3) s (computed from [39])', () => {
    const r = scaldTime(fToC(142.5));
    expect(r).toMatchObject({ qualifier: 'shorter-than', lowS: null });
    expect(r.highS!).toBeCloseTo(Math.sqrt(15), 12);
  });
  test('outside the table only a bound is given: below 120 °F longer than 5 min, above 155 °F shorter than 1 s [39]', () => {
    expect(scaldTime(40)).toMatchObject({ qualifier: 'longer-than', seconds: 300, highS: null, outsideTable: true, text: 'longer than 5 min' });
    expect(scaldTime(95)).toMatchObject({ qualifier: 'shorter-than', seconds: 1, lowS: null, outsideTable: true, text: 'shorter than 1 s' });
  });
  test('time never increases with temperature, and is finite over 0–100 °C', () => {
    let prev = Infinity;
    for (let t = 0; t <= 100; t += 0.25) {
      const s = scaldTime(t).seconds;
      expect(Number.isFinite(s)).toBe(true);
      expect(s).toBeLessThanOrEqual(prev + 1e-12);
      prev = s;
    }
  });
  test('the table holds the eight published rows, hottest last', () => {
    expect(SCALD_TIME_TABLE.map((r) => r.tempF)).toEqual([120, 125, 130, 135, 140, 145, 150, 155]);
  });
  test('NaN is a TypeError naming tempC', () => expect(() => scaldTime(Number.NaN)).toThrow(/tempC/));
});

describe('scald cautions state the exposure time (DOMAIN.md §5 [39])', () => {
  test('at 61 °C (142 °F) both scald messages say less than about 4.2 s; codes and levels unchanged', () => {
    const c = temperatureCautions(61, 'outlet');
    expect(c.map((x) => [x.code, x.level])).toEqual([['scald-seconds', 'danger'], ['scald', 'warning'], ['spa-limit', 'warning']]);
    const text = scaldTime(61).text;
    expect(text).toMatch(/^shorter than 4\.\d s$/);
    const said = text.replace('shorter than', 'less than');
    expect(c[0].message).toContain(`a serious scald takes ${said} of contact`);
    expect(c[1].message).toContain(`a serious scald takes ${said} of contact`);
    expect(c[2].message).not.toContain('serious scald');
  });
  test('at 54.44 °C (130 °F) the scald message says 30 s [39]', () => {
    expect(temperatureCautions(fToC(130), 'tub')[0].message).toContain('a serious scald takes 30 s of contact');
  });
  test('at 50 °C (122 °F) the scald caution gives the interpolated range and still defers to local codes', () => {
    expect(temperatureCautions(49.5, 'pool')[0].message).toMatch(/takes about 3\.\d–4\.\d min of contact/);
    const [scald] = temperatureCautions(50, 'pool');
    expect(scald.code).toBe('scald');
    expect(scald.message).toMatch(/about 3\.1–3\.5 min/);
    expect(scald.message).toMatch(/local codes/);
  });
});
