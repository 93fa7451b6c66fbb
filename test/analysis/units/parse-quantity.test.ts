import { describe, expect, test } from 'vitest';
import { referenceAvailable, readReference } from '../../support/reference';
import { convert, parseQuantity } from '../../../analysis/units/parse-quantity';

interface Factor { id: string; factor: number; exact: boolean; exactFactorText?: string; exactRational?: string }
interface UnitsFile { factors: Factor[]; temperature: { checkValues_derived: { t_F: number; T_K: number }[] } }

// Each pair: SP 811 factor id → the mathjs units it converts between in analysis/units/math.ts.
const PAIRS: [string, string, string][] = [
  ['inch-m', 'in', 'm'],
  ['foot-m', 'ft', 'm'],
  ['gallon-us-m3', 'gal', 'm^3'],
  ['gallon-us-l', 'gal', 'L'],
  ['cubic-foot-m3', 'ft^3', 'm^3'],
  ['liter-m3', 'L', 'm^3'],
  ['gpm-m3-per-s', 'gpm', 'm^3/s'],
  ['gpm-l-per-s', 'gpm', 'L/s'],
  ['pound-kg', 'lb', 'kg'],
  ['btu-it-j', 'Btu', 'J'],
  ['kilowatt-hour-j', 'kWh', 'J'],
  ['watt-hour-j', 'Wh', 'J'],
  ['therm-ec-j', 'thermEC', 'J'],
  ['therm-us-j', 'thermUS', 'J'],
  ['btu-it-per-hour-w', 'Btu/h', 'W'],
  ['btu-it-per-lb-j-per-kg', 'Btu/lb', 'J/kg'],
  ['btu-it-per-lb-degF-j-per-kg-k', 'Btu/(lb degFdiff)', 'J/(kg K)'],
  ['btu-it-per-h-ft2-degF-w-per-m2-k', 'Btu/(h ft^2 degFdiff)', 'W/(m^2 K)'],
  ['pound-per-gallon-us-kg-per-m3', 'lb/gal', 'kg/m^3'],
  ['psi-pa', 'psi', 'Pa'],
  ['atmosphere-standard-pa', 'atm', 'Pa'],
  ['horsepower-w', 'hp', 'W'],
];

function exactValue(f: Factor): number {
  if (f.exactFactorText) return Number(f.exactFactorText);
  if (f.exactRational) return Function(`return (${f.exactRational})`)() as number;
  return f.factor;
}

describe.skipIf(!referenceAvailable)('unit factors against NIST SP 811 (2008) Appendix B.8, reference/units.json', () => {
  const file = referenceAvailable ? readReference<UnitsFile>('units.json') : ({ factors: [], temperature: { checkValues_derived: [] } } as UnitsFile);
  test.each(PAIRS)('%s: 1 %s in %s matches the exact SP 811 / HB44 value to 1e-12', (id, from, to) => {
    const f = file.factors.find((x) => x.id === id);
    expect(f, id).toBeDefined();
    const got = convert(1, from, to);
    expect(Math.abs(got / exactValue(f!) - 1)).toBeLessThan(1e-12);
    // and the printed (possibly rounded) factor to its printed precision
    expect(Math.abs(got / f!.factor - 1)).toBeLessThan(f!.exact ? 1e-12 : 5e-7);
  });

  test('temperature relations of SP 811 B.8 (check values derived in units.json)', () => {
    for (const row of file.temperature.checkValues_derived) {
      expect(convert(row.t_F, 'degF', 'K')).toBeCloseTo(row.T_K, 10);
    }
  });
});

describe('parseQuantity reads what people type', () => {
  test.each([
    ['18 ft', 'length', 5.4864],
    ['4.5 gpm', 'volumeFlow', 4.5 * 3.785411784e-3 / 60],
    ['6 L/min', 'volumeFlow', 1e-4],
    ['75 degF', 'temperature', (75 - 32) / 1.8],
    ['90 degC', 'temperature', 90],
    ['300 K', 'temperature', 26.85],
    ['500 W/K', 'conductance', 500],
    ['100000 Btu/h', 'power', 29307.10701722222],
    ['1 therm', 'energy', 105505585.262],
    ['1000 gal', 'volume', 3.785411784],
    ['75 °F', 'temperature', (75 - 32) / 1.8],
    ['40°C', 'temperature', 40],
    ['12 lpm', 'volumeFlow', 2e-4],
    ['5 mph', 'speed', 5 * 1609.344 / 3600],
    ['50000 Btu/hr', 'power', 50000 * 1055.05585262 / 3600],
  ] as const)('%s as %s', (text, kind, si) => {
    expect(parseQuantity(text, kind, 'x')).toBeCloseTo(si, 9);
  });

  test('a temperature difference in degF is an interval of 1/1.8 K, not an absolute temperature', () => {
    expect(parseQuantity('20 degF', 'temperatureDifference', 'rise')).toBeCloseTo(20 / 1.8, 12);
    expect(parseQuantity('5 K', 'temperatureDifference', 'rise')).toBe(5);
  });

  test('2.5 gpm for six hours is 900 gallons (common practice)', () => {
    const m3 = parseQuantity('2.5 gpm', 'volumeFlow', 'flow') * 6 * 3600;
    expect(convert(m3, 'm^3', 'gal')).toBeCloseTo(900, 9);
  });

  test.each([
    ['5 kg', 'volumeFlow', /flow: "5 kg" is not a volumeFlow/],
    ['18 fts', 'length', /depth: cannot read "18 fts"/],
    ['-500 degF', 'temperature', /below absolute zero/],
    ['3 m', 'temperatureDifference', /not a temperature difference/],
  ] as const)('refuses %s for a %s, naming the field', (text, kind, msg) => {
    const field = kind === 'length' ? 'depth' : 'flow';
    expect(() => parseQuantity(text, kind, field)).toThrow(RangeError);
    expect(() => parseQuantity(text, kind, field)).toThrow(msg);
  });

  test('a bare number is refused with a TypeError naming the field', () => {
    expect(() => parseQuantity(12, 'volumeFlow', 'flow')).toThrow(TypeError);
    expect(() => parseQuantity(12, 'volumeFlow', 'flow')).toThrow(/flow/);
  });
});
