import { describe, expect, test } from 'vitest';
import { referenceAvailable, readReference } from '../../support/reference';
import { mixMassesTempC, mixTemperatureC, volumeWeightedTempC } from '../../../analysis/pool/mixing';
import * as mix from '../../../analysis/cli/mix';

type Row = { t_C: number; rho: number; h: number };
const rows: Row[] = referenceAvailable
  ? readReference<{ tables: { id: string; rows: Row[] }[] }>('water-properties.json').tables.find((t) => t.id === 'wp2002-isobar-0.101325MPa')!.rows
  : [];

/** The temperature whose tabulated enthalpy is h, by linear interpolation between the published rows. */
function tableTempAt(h: number): number {
  for (let i = 1; i < rows.length; i++) {
    if (h <= rows[i].h) return rows[i - 1].t_C + ((h - rows[i - 1].h) / (rows[i].h - rows[i - 1].h)) * (rows[i].t_C - rows[i - 1].t_C);
  }
  throw new Error(`h ${h} beyond the table`);
}

// IAPWS-95 at 0.101325 MPa (Wagner & Pruss 2002, Table 13.2, in shared/reference): a mixture's
// enthalpy is the mass-weighted mean of its parts' (energy balance, no losses), the mass of each
// part its volume times its density. IF97 (the code) and IAPWS-95 (the table) differ by up to
// 0.071 kJ/kg in h here (reference README), about 0.017 K; with the table's 5 K rows the
// interpolation adds under 0.005 K.
describe.skipIf(!referenceAvailable)('mixing by mass and enthalpy against the IAPWS-95 isobar (Wagner & Pruss 2002 Table 13.2)', () => {
  test.each([
    [1, 20, 1],
    [1, 1, 1],
    [5, 18, 3],
    [9, 14, 1],
  ])('%d m³ at row %d with %d m³ at row 1', (vHot, iHot, vCold) => {
    const hot = rows[iHot], cold = rows[1];
    const mHot = vHot * hot.rho, mCold = vCold * cold.rho;
    const expected = tableTempAt((mHot * hot.h + mCold * cold.h) / (mHot + mCold));
    const parts = [{ volumeM3: vHot, tempC: hot.t_C }, { volumeM3: vCold, tempC: cold.t_C }];
    expect(Math.abs(mixTemperatureC(parts) - expected)).toBeLessThan(0.03);
  });
  test('equal volumes at 1.85 °C and 96.85 °C: 48.4 °C, about 1 K below the volume-weighted 49.35 °C', () => {
    const parts = [{ volumeM3: 1, tempC: rows[1].t_C }, { volumeM3: 1, tempC: rows[20].t_C }];
    const t = mixTemperatureC(parts);
    expect(volumeWeightedTempC(parts)).toBeCloseTo(49.35, 2);
    expect(volumeWeightedTempC(parts) - t).toBeGreaterThan(0.9);
    const m = [rows[1].rho, rows[20].rho];
    expect(Math.abs(t - tableTempAt((m[0] * rows[1].h + m[1] * rows[20].h) / (m[0] + m[1])))).toBeLessThan(0.03);
  });
  test('masses mix by enthalpy: equal masses at 6.85 °C and 86.85 °C end where h is the mean of the two rows', () => {
    const t = mixMassesTempC([{ massKg: 1, tempC: rows[2].t_C }, { massKg: 1, tempC: rows[18].t_C }]);
    expect(Math.abs(t - tableTempAt((rows[2].h + rows[18].h) / 2))).toBeLessThan(0.03);
  });
});

describe('temperatures outside liquid water at 1 atm are refused, naming the field (IAPWS-IF97 region 1 at 101.325 kPa)', () => {
  test.each([
    [[{ volumeM3: 1, tempC: 20 }, { volumeM3: 1, tempC: 120 }], /parts\[1\]\.tempC/],
    [[{ volumeM3: 1, tempC: -5 }, { volumeM3: 1, tempC: 20 }], /parts\[0\]\.tempC/],
  ])('%j', (parts, msg) => {
    expect(() => mixTemperatureC(parts)).toThrow(RangeError);
    expect(() => mixTemperatureC(parts)).toThrow(msg);
  });
  test('the mix command says which part, in the user\'s words', () => {
    expect(() => mix.run({ parts: [{ volume: '10 gal', temp: '70 degF' }, { volume: '10 gal', temp: '230 degF' }] })).toThrow(/parts\[1\]\.temp/);
  });
});
