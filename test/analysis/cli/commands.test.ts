import { describe, expect, test } from 'vitest';
import * as volume from '../../../analysis/cli/volume';
import * as mix from '../../../analysis/cli/mix';
import * as coil from '../../../analysis/cli/coil';
import * as forecast from '../../../analysis/cli/forecast';
import * as uncertainty from '../../../analysis/cli/uncertainty';
import * as cost from '../../../analysis/cli/cost';
import { InputError } from '../../../analysis/units/reading-input';
import { waterDensityKgPerM3 } from '../../../analysis/water/water-properties';

type Out = Record<string, any>;

describe('volume command (contract of issue 5 item 13)', () => {
  test('round 15 ft × 4 ft → 5,288 gal (check value #5, computed)', () => {
    const r = volume.run({ shape: 'round', diameter: '15 ft', depth: '4 ft' }) as Out;
    expect(r.volume_gal).toBeCloseTo(5288, 0);
    expect(r.volume_m3).toBeCloseTo(20.016, 3);
    expect(r.area_m2).toBeCloseTo(16.417, 3);
  });
  test('rectangle with shallow and deep ends → 32,914 gal (check value #6)', () => {
    const r = volume.run({ shape: 'rectangle', length: '40 ft', width: '20 ft', shallowDepth: '3 ft', deepDepth: '8 ft' }) as Out;
    expect(r.volume_gal).toBeCloseTo(32914, 0);
  });
  test.each([
    [{ shape: 'round', diameter: '5 kg', depth: '4 ft' }, /diameter/],
    [{ shape: 'round', diameter: '-15 ft', depth: '4 ft' }, /diameterM|diameter/],
    [{ shape: 'blob', diameter: '15 ft', depth: '4 ft' }, /shape/],
    [{ shape: 'round', diameter: 15, depth: '4 ft' }, /diameter/],
  ])('malformed input %j is an InputError naming the field', (input, msg) => {
    expect(() => volume.run(input)).toThrow(InputError);
    expect(() => volume.run(input)).toThrow(msg);
  });
});

describe('mix command', () => {
  test('1000 gal at 100 °F + 9000 gal at 70 °F → 73 °F by the volume-weighted rule (common practice), 72.99 °F by mass and enthalpy', () => {
    const r = mix.run({ parts: [{ volume: '1000 gal', temp: '100 degF' }, { volume: '9000 gal', temp: '70 degF' }] }) as Out;
    expect(r.volumeWeighted.temp_degF).toBeCloseTo(73, 10);
    expect(r.volumeWeighted.temp_degC).toBeCloseTo(22.7778, 4);
    // the 100 °F water is 0.5 % lighter than the 70 °F water (IF97), so the mix lands a little lower
    expect(r.temp_degF).toBeLessThan(73);
    expect(r.temp_degF).toBeGreaterThan(72.98);
    expect(r.method).toMatch(/enthalpy/);
  });
  test('a negative volume is refused', () => {
    expect(() => mix.run({ parts: [{ volume: '-1 gal', temp: '100 degF' }] })).toThrow(/parts\[0\]\.volume/);
  });
});

describe('coil command', () => {
  test('Ts 90, Tin 20, UA 500, ṁ 0.1 kg/s → check value #2: ε 0.6971, Tout 68.80 °C, q 20,427 W (ε-NTU, computed)', () => {
    const r = coil.run({ sourceTemp: '90 degC', inletTemp: '20 degC', UA: '500 W/K', massFlow: '0.1 kg/s' }) as Out;
    // check #2 takes cp = 4186; the command takes IF97 cp at the mean water temperature, 4178.7 (0.17 % less)
    expect(r.cp_J_per_kg_K).toBeCloseTo(4178.7, 1);
    expect(Math.abs(r.outletTemp_degC - 68.8)).toBeLessThan(0.05);
    expect(Math.abs(r.heat_W / 20427 - 1)).toBeLessThan(0.002);
    expect(Math.abs(r.effectiveness - 0.6971)).toBeLessThan(0.001);
    expect(r.heatCeiling_W).toBe(35000);
    expect(r.cautions.map((c: Out) => c.code)).toContain('scald-seconds');
    expect(r.minimumFlows.map((m: Out) => m.limit_degC)).toEqual([60, 49, 40]);
  });
  test('6 L/min of outlet water (a bucket): ṁ = ρ(Tout)·V̇ (DOMAIN.md §1.1); measured at the inlet: ρ(Tin)·V̇', () => {
    const r = coil.run({ sourceTemp: '90 degC', inletTemp: '20 degC', UA: '500 W/K', flow: '6 L/min' }) as Out;
    expect(r.density_kg_per_m3).toBeCloseTo(waterDensityKgPerM3(r.outletTemp_degC), 9);
    expect(r.massFlow_kg_per_s).toBeCloseTo((r.density_kg_per_m3 * 6) / 60000, 12);
    const atInlet = coil.run({ sourceTemp: '90 degC', inletTemp: '20 degC', UA: '500 W/K', flow: '6 L/min', flowMeasuredAt: 'inlet' }) as Out;
    expect(atInlet.density_kg_per_m3).toBeCloseTo(waterDensityKgPerM3(20), 9);
    // lighter outlet water: less mass for the same volume, so a hotter outlet
    expect(r.outletTemp_degC).toBeGreaterThan(atInlet.outletTemp_degC);
  });
  test('zero flow gives the dead-heading warning, not NaN', () => {
    const r = coil.run({ sourceTemp: '150 degC', inletTemp: '20 degC', UA: '500 W/K', flow: '0 L/min' }) as Out;
    expect(r.cautions.map((c: Out) => c.code)).toEqual(expect.arrayContaining(['dead-heading', 'above-boiling-source', 'near-boiling']));
    expect(JSON.stringify(r)).not.toMatch(/NaN/);
  });
  test.each([
    [{ sourceTemp: '90 degC', inletTemp: '20 degC', UA: '500 W/K', flow: '5 kg' }, /flow/],
    [{ sourceTemp: '10 degC', inletTemp: '20 degC', UA: '500 W/K', flow: '6 L/min' }, /sourceTemp.*inletTemp/],
    [{ sourceTemp: '90 degC', inletTemp: '120 degC', UA: '500 W/K', flow: '6 L/min' }, /inletTemp/],
    [{ sourceTemp: '90 degC', inletTemp: '20 degC', UA: '500 W', flow: '6 L/min' }, /UA/],
  ])('refuses %j', (input, msg) => {
    expect(() => coil.run(input)).toThrow(InputError);
    expect(() => coil.run(input)).toThrow(msg);
  });
});

describe('forecast command', () => {
  const contract = { poolVolume: '15000 gal', startTemp: '20 degC', hours: 24, flow: '12 L/min', heater: { model: 'coil', sourceTemp: '90 degC', UA: '500 W/K' }, losses: false };
  test('the contract input lands within 0.03 K of check value #13 (28.98 °C; the check takes M = 56,588 kg and cp 4186)', () => {
    const r = forecast.run(contract) as Out;
    expect(Math.abs(r.finalTemp_degC - 28.98)).toBeLessThan(0.03);
    expect(r.series).toHaveLength(25);
    expect(r.series[0]).toEqual({ time_h: 0, temp_degC: 20, outletTemp_degC: expect.any(Number) });
    expect(Array.isArray(r.series)).toBe(true);
  });
  test('with the pool mass of the check it gives 28.98 °C', () => {
    const r = forecast.run({ ...contract, poolVolume: undefined, poolMass: '56588 kg' }) as Out;
    expect(Math.abs(r.finalTemp_degC - 28.98)).toBeLessThan(0.01);
  });
  test('losses with hourly weather, a cover and walls', () => {
    const weather = Array.from({ length: 24 }, (_, h) => ({ airTemp: `${15 + (h > 8 && h < 18 ? 8 : 0)} degC`, relativeHumidity: 0.6, wind: '1 m/s', solar: `${h > 7 && h < 19 ? 500 : 0} W/m^2` }));
    const r = forecast.run({
      ...contract, hours: 72, targetTemp: '24 degC',
      losses: { surfaceArea: '46.6 m^2', weather, walls: { area: '30 m^2', U: '1.5 W/(m^2 K)', groundTemp: '15 degC' }, cover: { coveredHours: [0, 1, 2, 3, 22, 23] } },
    }) as Out;
    expect(r.energy_J.evaporation_J).toBeGreaterThan(0);
    expect(r.energy_J.solar_J).toBeGreaterThan(0);
    expect(Number.isFinite(r.finalTemp_degC)).toBe(true);
  });
  test.each([
    [{ ...contract, flow: '5 kg' }, /flow/],
    [{ ...contract, poolVolume: '-15000 gal' }, /poolVolume/],
    [{ ...contract, heater: { model: 'magic' } }, /heater.model/],
    [{ ...contract, hours: undefined }, /hours/],
  ])('refuses malformed input %#', (input, msg) => {
    expect(() => forecast.run(input)).toThrow(InputError);
    expect(() => forecast.run(input)).toThrow(msg);
  });
});

describe('uncertainty command', () => {
  test('the GUM worked example, check value #12 (DOMAIN.md §2.5): q 20.97 kW, u_rel 4.17 %, U(k = 2) 1.75 kW', () => {
    const r = uncertainty.run({
      bucketVolume: '18.93 L', volumeTolerance: '0.25 L', fillTimes: ['74.6 s', '75.3 s', '75.1 s'], timingUncertainty: '0.1 s',
      inletTemp: '15 degC', outletTemp: '35 degC', sensorTolerance: '1 K', density: '994 kg/m^3', cp: '4.18 kJ/(kg K)', k: 2,
    }) as Out;
    expect(r.heat_W / 1000).toBeCloseTo(20.97, 2);
    expect(r.heatRelative * 100).toBeCloseTo(4.17, 2);
    expect(r.heatU_W / 1000).toBeCloseTo(1.75, 2);
    expect(r.budget.heat).toHaveLength(5);
  });
  test('refuses fill times without units', () => {
    expect(() => uncertainty.run({ bucketVolume: '18.93 L', fillTimes: [75], inletTemp: '15 degC', outletTemp: '35 degC', sensorTolerance: '1 K' })).toThrow(/fillTimes\[0\]/);
  });
});

describe('cost command', () => {
  test('propane $3.00/gal η 0.82 → $4.00 per useful therm, $5.00 per °F for 15,000 gal (check value #16, DOMAIN.md §6)', () => {
    const r = cost.run({ fuel: 'propane', price: 3, efficiency: 0.82, poolVolume: '15000 gal' }) as Out;
    expect(r.cost_per_useful_therm).toBeCloseTo(4.0, 2);
    expect(r.cost_per_degF).toBeCloseTo(5.0, 1);
    expect(r.basis).toBe('HHV');
  });
  test('build sheet and payback against gas', () => {
    const r = cost.run({
      fuel: 'heat-pump', price: 0.15, efficiency: 5,
      build: { items: [{ subassembly: 'pump', description: 'circulator', quantity: 1, unitCost: 400 }], taxRate: 0.05 },
      payback: { otherFuel: 'natural-gas', otherPrice: 1.5, otherEfficiency: 0.82, annualUsefulHeat: '1000 therm' },
    }) as Out;
    expect(r.build.total).toBe(420);
    expect(r.payback.years_y).toBeCloseTo(420 / (1000 * (1.5 / 0.82 - r.cost_per_useful_therm)), 9);
  });
  test('refuses an unknown fuel', () => expect(() => cost.run({ fuel: 'coal', price: 1 })).toThrow(/fuel must be one of/));
});

import { spawnSync } from 'node:child_process';
import path from 'node:path';

// Each case starts Node with tsx; on a loaded machine that takes seconds. The timeout is a hang guard, not a timing.
describe('the command line itself', { timeout: 90_000 }, () => {
  const root = path.resolve(__dirname, '..', '..', '..');
  const cli = (cmd: string, input: unknown) =>
    spawnSync(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'analysis/cli.ts'), cmd], { input: JSON.stringify(input), encoding: 'utf8' });
  test('prints one JSON object and exits 0; malformed input exits 2 naming the field', () => {
    const ok = cli('coil', { sourceTemp: '90 degC', inletTemp: '20 degC', UA: '500 W/K', massFlow: '0.1 kg/s' });
    expect(ok.status).toBe(0);
    expect(JSON.parse(ok.stdout).outletTemp_degC).toBeCloseTo(68.8, 1); // check value #2
    const bad = cli('coil', { sourceTemp: '90 degC', inletTemp: '20 degC', UA: '500 W/K', flow: '5 kg' });
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/flow: "5 kg" is not a volumeFlow/);
  });
});
