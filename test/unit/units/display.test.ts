/**
 * The one units edge (app/_contracts/units.ts): every display factor is the conversion that
 * analysis/units (the mathjs instance, checked against NIST SP 811 in test/analysis/units) gives
 * for the same unit, the exact definitions it is composed from are the SP 811 values, and the
 * labels are the ones the screens, plots and exports print.
 */
import { describe, expect, test } from 'vitest';
import { DISPLAY_TABLE, displayUnit, displayUnits, fmt, spreadToDisplay, toDisplay, withUnit, type DisplayQuantity } from '../../../app/_contracts/units';
import * as EXACT from '../../../analysis/units/exact-factors';
import { convert, fromSI } from '../../../analysis/units/parse-quantity';
import { UNIT_SYSTEMS } from '../../../analysis/units/unit-system';
import { readReference, referenceAvailable } from '../../support/reference';

const QUANTITIES = Object.keys(DISPLAY_TABLE) as DisplayQuantity[];
const CASES = QUANTITIES.flatMap((q) => UNIT_SYSTEMS.map((s) => [q, s] as const));

describe('display factors agree with analysis/units (mathjs)', () => {
  test.each(CASES)('%s in %s: factor and offset are mathjs’s conversion of its mathUnit, to 15 digits', (q, s) => {
    const u = displayUnit(q, s);
    const si = DISPLAY_TABLE[q][0];
    const offset = q === 'temperature' ? fromSI(0, 'temperature', u.mathUnit) : 0;
    const factor = q === 'temperature' ? fromSI(1, 'temperature', u.mathUnit) - offset : convert(1, si, u.mathUnit);
    expect(u.factor).toBe(Number(factor.toPrecision(15)));
    expect(u.offset).toBe(Number(offset.toPrecision(15)));
  });

  test.each(CASES)('%s in %s: to() undoes from()', (q, s) => {
    const u = displayUnit(q, s);
    for (const v of [0.000283906, 1, 62.5, 29307.1]) expect(u.to(u.from(v))).toBeCloseTo(v, 9);
  });
});

describe.skipIf(!referenceAvailable)('the exact definitions are the NIST SP 811 (2008) values (reference/units.json)', () => {
  type Factor = { id: string; factor: number; exact: boolean; exactFactorText?: string; exactRational?: string };
  const file = referenceAvailable ? readReference<{ factors: Factor[] }>('units.json') : { factors: [] as Factor[] };
  const f = (id: string) => file.factors.find((x) => x.id === id)!;
  // the exact value: boldface in SP 811, else the file's exact decimal or rational (as in test/analysis/units)
  const exact = (x: Factor) => (x.exactFactorText ? Number(x.exactFactorText) : x.exactRational ? (Function(`return (${x.exactRational})`)() as number) : x.factor);
  test.each([
    ['gallon-us-l', EXACT.LITRES_PER_US_GALLON],
    ['foot-m', EXACT.METRES_PER_FOOT],
    ['mile-m', EXACT.METRES_PER_MILE],
    ['pound-kg', EXACT.KILOGRAMS_PER_POUND],
    ['btu-it-j', EXACT.JOULES_PER_BTU],
    ['kilowatt-hour-j', EXACT.JOULES_PER_KILOWATT_HOUR],
  ] as const)('%s', (id, value) => {
    expect(Math.abs(value / exact(f(id)) - 1)).toBeLessThan(1e-15);
  });

  test('1 gpm and 1 Btu/h on screen are the SP 811 factors inverted', () => {
    // SP 811 B.8: gallon (U.S.) per minute = 6.309 020 E-05 m³/s; Btu_IT per hour = 2.930 711 E-01 W (rounded)
    expect(displayUnit('volumeFlow', 'us').to(1) / f('gpm-m3-per-s').factor - 1).toBeLessThan(1e-6);
    expect(displayUnit('power', 'us').to(1) / f('btu-it-per-hour-w').factor - 1).toBeLessThan(1e-6);
  });
});

describe('mathjs’s own units match the exact definitions the display converts with', () => {
  test.each([
    ['gal', 'L', EXACT.LITRES_PER_US_GALLON],
    ['ft', 'm', EXACT.METRES_PER_FOOT],
    ['mi', 'm', EXACT.METRES_PER_MILE],
    ['lb', 'kg', EXACT.KILOGRAMS_PER_POUND],
    ['Btu', 'J', EXACT.JOULES_PER_BTU],
    ['therm', 'J', EXACT.JOULES_PER_THERM],
    ['kWh', 'J', EXACT.JOULES_PER_KILOWATT_HOUR],
  ] as const)('1 %s = %s %s', (from, to, value) => {
    expect(Math.abs(convert(1, from, to) / value - 1)).toBeLessThan(1e-15);
  });

  test('°F from °C: t/°F = 1.8 t/°C + 32 (SP 811 B.9)', () => {
    expect(EXACT.celsiusToFahrenheit(60)).toBe(140);
    expect(EXACT.celsiusToFahrenheit(-40)).toBe(-40);
    expect(EXACT.fahrenheitToCelsius(212)).toBe(100);
    expect(EXACT.celsiusToFahrenheit(37)).toBeCloseTo(convert(37, 'degC', 'degF'), 12);
  });
});

describe('labels and rounding as the screens, plots and exports print them', () => {
  test.each([
    ['volumeFlow', 'L/min', 'gpm'],
    ['temperature', '°C', '°F'],
    ['temperatureDifference', 'K', '°F'],
    ['power', 'kW', 'Btu/h'],
    ['energy', 'kWh', 'therm'],
    ['volume', 'L', 'gal'],
    ['poolVolume', 'm³', 'gal'],
    ['length', 'm', 'ft'],
    ['area', 'm²', 'ft²'],
    ['speed', 'm/s', 'mph'],
    ['conductance', 'W/K', 'Btu/(h·°F)'],
  ] as const)('%s: %s and %s', (q, si, us) => {
    expect(displayUnit(q, 'si').label).toBe(si);
    expect(displayUnit(q, 'us').label).toBe(us);
  });

  test('check values (common practice: 20 °C = 68 °F; 12 L/min = 2e-4 m³/s; 60 °C spa water is 140 °F)', () => {
    expect(displayUnits('us').temp.from(20)).toBe(68);
    expect(displayUnits('si').flow.from(2e-4)).toBeCloseTo(12, 12);
    expect(withUnit(60, displayUnit('temperature', 'us'))).toBe('140 °F');
    expect(withUnit(20, displayUnit('temperature', 'us'))).toBe('68.0 °F');
    expect(fmt(29_400)).toBe('29,400');
    expect(fmt(Number.NaN)).toBe('–');
    expect(toDisplay(null, 'temperature', 'us')).toBeNull();
    expect(spreadToDisplay(1, 'temperature', 'us')).toBe(1.8);
  });

  test('an unknown system or quantity is refused', () => {
    expect(() => displayUnit('temperature', 'metric' as never)).toThrow(RangeError);
    expect(() => displayUnit('pressure' as never, 'si')).toThrow(RangeError);
  });
});
