import { describe, expect, test } from 'vitest';
import { referenceAvailable, readReference } from '../../support/reference';
import { if97Region1 } from '../../../analysis/water/if97-region1';
import { saturationPressurePa, saturationTempC } from '../../../analysis/water/saturation-pressure';
import { latentHeatJPerKg, saturationState } from '../../../analysis/water/latent-heat';
import {
  waterCpJPerKgK,
  waterDensityKgPerM3,
  waterEnthalpyJPerKg,
} from '../../../analysis/water/water-properties';
import { fastCpJPerKgK, fastDensityKgPerM3 } from '../../../analysis/water/property-table';

type Row = Record<string, number>;
interface Table { id: string; rows: Row[] }
const tables: Table[] = referenceAvailable ? readReference<{ tables: Table[] }>('water-properties.json').tables : [];
const table = (id: string) => tables.find((t) => t.id === id)?.rows ?? [];
const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe.skipIf(!referenceAvailable)('IAPWS-IF97 verification values (IAPWS R7-97, reference/water-properties.json)', () => {
  test('region 1, Table 5: v, h, u, s, cp, w at three states to 1e-8', () => {
    for (const r of table('if97-table5')) {
      const s = if97Region1(r.T_K, r.p_MPa * 1e6);
      expect(rel(s.specificVolumeM3PerKg, r.v)).toBeLessThan(1e-8);
      expect(rel(s.enthalpyJPerKg / 1000, r.h)).toBeLessThan(1e-8);
      expect(rel(s.internalEnergyJPerKg / 1000, r.u)).toBeLessThan(1e-8);
      expect(rel(s.entropyJPerKgK / 1000, r.s)).toBeLessThan(1e-8);
      expect(rel(s.cpJPerKgK / 1000, r.cp)).toBeLessThan(1e-8);
      expect(rel(s.soundSpeedMPerS, r.w)).toBeLessThan(1e-8);
    }
  });
  test('region 4, Table 35: saturation pressure to 1e-8', () => {
    for (const r of table('if97-table35')) {
      expect(rel(saturationPressurePa(r.T_K - 273.15), r.ps_MPa * 1e6)).toBeLessThan(1e-8);
    }
  });
  test('region 4, Table 36: saturation temperature to 1e-8', () => {
    for (const r of table('if97-table36')) {
      expect(rel(saturationTempC(r.p_MPa * 1e6) + 273.15, r.Ts_K)).toBeLessThan(1e-8);
    }
  });
});

describe.skipIf(!referenceAvailable)('liquid water at 0.101325 MPa against IAPWS-95 (Wagner & Pruss 2002 Table 13.2)', () => {
  const rows = table('wp2002-isobar-0.101325MPa');
  test('the table is there', () => expect(rows.length).toBeGreaterThan(20));
  test('density within 1e-4 relative, cp within 1e-3 relative, enthalpy within 0.1 kJ/kg', () => {
    for (const r of rows) {
      const t = Math.min(r.t_C, 100);
      expect(rel(waterDensityKgPerM3(t), r.rho), `rho at ${r.t_C}`).toBeLessThan(1e-4);
      expect(rel(waterCpJPerKgK(t) / 1000, r.cp), `cp at ${r.t_C}`).toBeLessThan(1e-3);
      // IF97 vs IAPWS-95 enthalpy differs by up to 0.071 kJ/kg here (reference/README.md §2)
      expect(Math.abs(waterEnthalpyJPerKg(t) / 1000 - r.h), `h at ${r.t_C}`).toBeLessThan(0.1);
    }
  });
  test('every whole degree 0–99 °C of the computed IAPWS-95 grid (computed, not published)', () => {
    for (const r of table('computed-iapws95-0.101325MPa-1C')) {
      expect(rel(waterDensityKgPerM3(r.t_C), r.rho)).toBeLessThan(1e-4);
      expect(rel(waterCpJPerKgK(r.t_C) / 1000, r.cp)).toBeLessThan(1e-3);
      expect(rel(fastDensityKgPerM3(r.t_C), r.rho)).toBeLessThan(1e-4);
      expect(rel(fastCpJPerKgK(r.t_C) / 1000, r.cp)).toBeLessThan(1e-3);
    }
  });
});

describe.skipIf(!referenceAvailable)('saturation and latent heat against IAPWS-95 (R6-95 Table 8, WP2002 Table 13.1)', () => {
  test('latent heat hV − hL at 275 K and 450 K within 2e-4 relative (SR1-86 auxiliary equations)', () => {
    for (const r of table('iapws95-table8')) {
      expect(rel(latentHeatJPerKg(r.T_K - 273.15) / 1000, r.hV - r.hL)).toBeLessThan(2e-4);
      const s = saturationState(r.T_K - 273.15);
      expect(rel(s.vapourDensityKgPerM3, r.rhoV)).toBeLessThan(2e-4);
    }
  });
  test('IF97 saturation pressure follows the IAPWS-95 saturated-liquid line to 1e-3', () => {
    for (const r of table('wp2002-saturation-liquid').filter((x) => x.t_C <= 100 && x.p_MPa > 0.001)) {
      expect(rel(saturationPressurePa(r.t_C) / 1e6, r.p_MPa), `psat at ${r.t_C}`).toBeLessThan(1e-3);
    }
  });
});

describe('water facts of the trade and stated numbers', () => {
  test('water boils at 212 °F at sea level (common practice): Tsat(1 atm) = 99.974 °C ≈ 211.95 °F', () => {
    const f = saturationTempC(101325) * 1.8 + 32;
    expect(Math.abs(f - 212)).toBeLessThan(0.1);
  });
  test('latent heat at 80 °F is about 1,048 Btu/lb (DOMAIN.md §3.4 [4a])', () => {
    const btuPerLb = latentHeatJPerKg((80 - 32) / 1.8) / 2326;
    expect(btuPerLb).toBeCloseTo(1048, 0);
  });
  test('psat at 80 °F is 3.499 kPa and at 60 °F 1.768 kPa (DOMAIN.md §3.4, IAPWS-IF97)', () => {
    expect(saturationPressurePa((80 - 32) / 1.8) / 1000).toBeCloseTo(3.499, 3);
    expect(saturationPressurePa((60 - 32) / 1.8) / 1000).toBeCloseTo(1.768, 3);
  });
});

describe('degenerate input', () => {
  test.each([-1, 100.5, 150])('refuses %s °C at 1 atm with a RangeError naming the field', (t) => {
    expect(() => waterDensityKgPerM3(t)).toThrow(RangeError);
    expect(() => waterDensityKgPerM3(t, undefined, 'inletTempC')).toThrow(/inletTempC/);
  });
  test('accepts 150 °C under 10 bar (a closed coil)', () => {
    expect(waterDensityKgPerM3(150, 1e6)).toBeGreaterThan(900);
  });
  test('NaN is a TypeError', () => {
    expect(() => waterCpJPerKgK(Number.NaN)).toThrow(TypeError);
    expect(() => saturationPressurePa(Number.NaN)).toThrow(TypeError);
  });
});
