import { describe, expect, test } from 'vitest';
import { annualHeaterEnergy, DOE_BURNER_OPERATING_HOURS, DOE_POOL_OPERATING_HOURS } from '../../../analysis/cost/annual-energy';
import { convert } from '../../../analysis/units/parse-quantity';

const btuh = (x: number) => convert(x, 'Btu/h', 'W');

describe('annual energy by 10 CFR 430 Subpart B App. P (DOMAIN.md §4, §6)', () => {
  test('check value #17: BOH 104 h, POH 4,464 h; the pilot burns alone 4,360 h [17]', () => {
    expect(DOE_BURNER_OPERATING_HOURS).toBe(104);
    expect(DOE_POOL_OPERATING_HOURS).toBe(4464);
    expect(annualHeaterEnergy({ fuelInputW: 1000 }).pilotOnlyHours).toBe(4360); // DOMAIN.md §6: EF = 104 h·QIN + 4,360 h·QP
  });
  test('EF = BOH·QIN + (POH − BOH)·QP: 250,000 Btu/h input with a 1,000 Btu/h pilot → 30.36 MMBtu a year [17] (computed)', () => {
    const r = annualHeaterEnergy({ fuelInputW: btuh(250_000), pilotW: btuh(1_000) });
    expect(convert(r.fuelJ, 'J', 'Btu')).toBeCloseTo(104 * 250_000 + 4360 * 1_000, 3);
    expect(convert(r.fuelJ, 'J', 'MMBtu')).toBeCloseTo(30.36, 9);
    expect(r.electricJ).toBe(0);
    expect(r.usefulJ).toBeNull();
  });
  test('EAE = BOH·PE: 200 W of auxiliary power → 20.8 kWh a year [17] (computed)', () => {
    expect(convert(annualHeaterEnergy({ fuelInputW: 0, auxElectricW: 200 }).electricJ, 'J', 'kWh')).toBeCloseTo(20.8, 12);
  });
  test('no pilot: only the burner hours count; useful heat = Et·BOH·QIN when Et is given (our addition)', () => {
    const r = annualHeaterEnergy({ fuelInputW: 50_000, thermalEfficiency: 0.82 });
    expect(r.fuelJ).toBe(104 * 3600 * 50_000);
    expect(r.usefulJ!).toBeCloseTo(0.82 * 104 * 3600 * 50_000, 3);
  });
  test('other hours can be given for a different season', () => {
    expect(annualHeaterEnergy({ fuelInputW: 1, pilotW: 1, burnerHours: 200, poolHours: 2000 }).fuelJ).toBe(2000 * 3600);
  });
  test.each([
    [{ fuelInputW: -1 }, /fuelInputW/],
    [{ fuelInputW: 1, pilotW: Number.NaN }, /pilotW/],
    [{ fuelInputW: 1, thermalEfficiency: 1.2 }, /thermalEfficiency/],
    [{ fuelInputW: 1, burnerHours: 5000 }, /poolHours \(4464\) must be at least burnerHours \(5000\)/],
  ])('refuses %j', (o, msg) => expect(() => annualHeaterEnergy(o)).toThrow(msg));
});
