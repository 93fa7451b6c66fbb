import { describe, expect, test } from 'vitest';
import * as volume from '../../../analysis/cli/volume';
import * as forecast from '../../../analysis/cli/forecast';
import * as mix from '../../../analysis/cli/mix';
import * as uncertainty from '../../../analysis/cli/uncertainty';
import * as cost from '../../../analysis/cli/cost';
import { inUserWords } from '../../../analysis/units/read-fields';

// Common practice: an error names the field as the user wrote it and echoes the value as the user
// wrote it, in the user's unit, not the internal SI field and number (−18 ft is −5.4864 m inside).
const messageOf = (f: () => unknown): string => {
  try {
    f();
  } catch (e) {
    expect((e as Error).name).toBe('InputError');
    return (e as Error).message;
  }
  throw new Error('expected an error');
};

describe('errors in the user\'s words (common practice)', () => {
  test('volume: a negative deep end is told as typed', () => {
    const m = messageOf(() => volume.run({ shape: 'rectangle', length: '40 ft', width: '20 ft', shallowDepth: '3 ft', deepDepth: '-18 ft' }));
    expect(m).toMatch(/^deepDepth must be greater than 0, got "-18 ft"$/);
    expect(m).not.toMatch(/deepDepthM|5\.4864/);
  });
  test('volume: two fields in one message, both as typed', () => {
    const m = messageOf(() => volume.run({ shape: 'rectangle', length: '40 ft', width: '20 ft', shallowDepth: '8 ft', deepDepth: '3 ft' }));
    expect(m).toBe('deepDepth ("3 ft") must not be less than shallowDepth ("8 ft")');
  });
  test('volume: a field that was not given is still named as the user would', () => {
    expect(messageOf(() => volume.run({ shape: 'rectangle', length: '40 ft', width: '20 ft' }))).toBe('give either depth or both shallowDepth and deepDepth');
  });
  const contract = { poolVolume: '12000 gal', startTemp: '64 degF', hours: 24, flow: '2.5 gpm', heater: { model: 'coil', sourceTemp: '190 degF', UA: '430 W/K' }, losses: false };
  test.each([
    [{ startTemp: '230 degF' }, /^startTemp must be between 0 and 100 °C .*got "230 degF"$/],
    [{ heater: { model: 'coil', sourceTemp: '190 degF', UA: '-430 W/K' } }, /^heater\.UA must be greater than 0, got "-430 W\/K"$/],
    [{ heater: { model: 'fixed-rise', rise: '-9 degF' } }, /^heater\.rise must be 0 or more/],
    [{ poolVolume: '-12000 gal' }, /^poolVolume must be greater than 0, got "-12000 gal"$/],
    [{ losses: { surfaceArea: '800 ft^2', weather: { airTemp: '70 degF', relativeHumidity: 0.5 }, walls: { area: '300 ft^2', U: '-0.2 BTU/(h ft^2 degF)' } } }, /^losses\.walls\.U must be 0 or more, got "-0.2 BTU\/\(h ft\^2 degF\)"$/],
    [{ losses: { surfaceArea: '800 ft^2', weather: [{ airTemp: '70 degF', relativeHumidity: 0.5 }, { airTemp: '167 degF', relativeHumidity: 0.5 }] } }, /^losses\.weather\[1\]\.airTemp must be between -60 and 60, got "167 degF"$/],
    [{ losses: { surfaceArea: '800 ft^2', weather: { airTemp: '70 degF', dewPoint: '75 degF' } } }, /^losses\.weather\.dewPoint \("75 degF"\) must not exceed losses\.weather\.airTemp \("70 degF"\)$/],
  ])('forecast %j', (patch, msg) => {
    expect(messageOf(() => forecast.run({ ...contract, ...patch }))).toMatch(msg);
  });
  test('mix: the part and its temperature as typed', () => {
    expect(messageOf(() => mix.run({ parts: [{ volume: '10 gal', temp: '70 degF' }, { volume: '10 gal', temp: '230 degF' }] }))).toMatch(/^parts\[1\]\.temp must be between 0 and 100 °C .*got "230 degF"$/);
  });
  test('uncertainty: a fill time as typed', () => {
    expect(messageOf(() => uncertainty.run({ bucketVolume: '20 L', fillTimes: ['80 s', '-0.5 min'], inletTemp: '17.5 degC', outletTemp: '52 degC', sensorTolerance: '0.5 K' })))
      .toMatch(/^fillTimes\[1\] must be greater than 0, got "-0.5 min"$/);
  });
  test('cost: a build line under build', () => {
    expect(messageOf(() => cost.run({ fuel: 'propane', price: 3, build: { items: [{ subassembly: 'coil', description: 'tube', quantity: -2, unitCost: 40 }] } }))).toMatch(/^build\.items\[0\]\.quantity must be 0 or more/);
  });
  test('a value equal to a number in the message text is only replaced where it is the field\'s', () => {
    expect(inUserWords('widthM must be greater than 0, got 0', [{ path: 'width', text: '0 ft', value: 0, as: 'widthM' }])).toBe('width must be greater than 0, got "0 ft"');
  });
});
