import { describe, expect, test } from 'vitest';
import { comparisonSheet } from '../../../app/_lib/exports/comparison-sheet';
import { studyCsv } from '../../../app/_lib/exports/study-workbook';
import type { DesignComparisonView, DesignView } from '../../../app/_contracts/design-comparison';

// Round numbers of our own; conversions checked against NIST SP 811 (°F = 1.8·°C + 32; 1 Btu/h = 0.29307107 W,
// so 1 W = 3.4121416 Btu/h; 1 ft = 0.3048 m) and the 60 °C "burns in seconds" band of DOMAIN.md §5.
const design = (key: string, ua: number, heatW: number, tube: number, cost: number): DesignView => ({
  key, label: `Coil ${key}`, kind: 'rig', id: null, rigId: null, rigName: `Coil ${key}`, model: 'coil', modelLabel: 'Constant-source coil (ε–NTU)',
  n: 12, residualSD: 0.3, flowRangeM3PerS: [5e-5, 3e-4], maxOutletC: 70,
  params: [{ name: 'Ts', value: 85, stdErr: 0.5, ciLow: 84, ciHigh: 86 }, { name: 'UA', value: ua, stdErr: 10, ciLow: ua - 20, ciHigh: ua + 20 }],
  heatW: { value: heatW, ciLow: heatW - 100, ciHigh: heatW + 100 }, tubeLengthM: tube, collectorAreaM2: null, buildCost: { amount: cost, currency: 'USD' },
  heatPerMetreW: heatW / tube, heatPerM2W: null, heatPerCostW: heatW / cost, warnings: [],
});
const view: DesignComparisonView = {
  title: 'Longer coil', inletTempC: 20, flowM3PerS: 10 / 60000, level: 0.95,
  designs: [design('A', 400, 20000, 12, 200), design('B', 500, 23000, 15, 250)],
  pairs: [{
    keys: ['A', 'B'], uaRatio: { value: 1.25, ciLow: 1.1, ciHigh: 1.4, bootstrap: { ciLow: 1.12, ciHigh: 1.41 } }, tsDifferenceK: { value: 0, ciLow: -1, ciHigh: 1, bootstrap: null },
    heatDifferencePercent: { value: 15, ciLow: 12, ciHigh: 18, bootstrap: { ciLow: 12.5, ciHigh: 18.2 } }, verdict: 'Coil B delivers 12–18 % more heat at 10 L/min than Coil A.', notes: [],
  }],
  heatTable: [{ flowM3PerS: 1e-4, heatW: [18000, 20000], extrapolated: false }],
  plots: { outlet: { title: '', summary: '', svg: '' }, heat: { title: '', summary: '', svg: '' } }, verdict: 'Coil B delivers 12–18 % more heat at 10 L/min than Coil A.', notes: [], problems: [],
};
const row = (rows: Record<string, unknown>[], design: string, quantity: string | RegExp) => rows.find((r) => r.design === design && (typeof quantity === 'string' ? r.quantity === quantity : quantity.test(String(r.quantity))))!;

describe('the Comparison sheet', () => {
  test('SI: parameters with their intervals, heat in kW, per metre and per unit of cost, the pair with both intervals', () => {
    const s = comparisonSheet([view], 'si');
    expect(s.name).toBe('Comparison');
    expect(row(s.rows, 'A: Coil A', 'UA')).toMatchObject({ value: 400, ciLow: 380, ciHigh: 420, unit: 'W/K' });
    expect(row(s.rows, 'B: Coil B', /^Heat at /)).toMatchObject({ value: 23, unit: 'kW' });
    expect(row(s.rows, 'B: Coil B', 'Heat per length of tube').value).toBeCloseTo(23 / 15, 12);
    expect(row(s.rows, 'A: Coil A', 'Heat per unit of build cost')).toMatchObject({ value: 0.1, unit: 'kW/USD' });
    expect(row(s.rows, 'B against A', 'UA ratio')).toMatchObject({ value: 1.25, ciLow: 1.1, ciHigh: 1.4, bootLow: 1.12, bootHigh: 1.41 });
    expect(row(s.rows, 'B against A', 'Verdict').note).toMatch(/12–18 % more heat/);
  });
  test('US customary: °F, Btu/h, Btu/(h·°F) and per foot (NIST SP 811)', () => {
    const s = comparisonSheet([view], 'us');
    expect(row(s.rows, 'A: Coil A', 'Ts').value).toBeCloseTo(185, 9);
    expect(row(s.rows, 'A: Coil A', 'UA').value).toBeCloseTo(400 * 3.4121416 / 1.8, 4);
    expect(row(s.rows, 'A: Coil A', /^Heat at /).value).toBeCloseTo(20000 * 3.4121416, 2);
    expect(row(s.rows, 'A: Coil A', 'Heat per length of tube').value).toBeCloseTo((20000 * 3.4121416) / (12 / 0.3048), 2);
    expect(row(s.rows, 'B against A', 'Ts difference')).toMatchObject({ ciLow: -1.8, ciHigh: 1.8 });
  });
  test('a source at 85 °C is marked in the Caution column and the sheet starts with the safety notice', () => {
    const s = comparisonSheet([view], 'si');
    expect(String(row(s.rows, 'A: Coil A', 'Ts').caution)).toMatch(/60 °C/);
    expect(s.notice!.join('\n')).toMatch(/40/);
    const csv = studyCsv({ unitSystem: 'si', provenance: { lab: 'Bench', softwareVersion: 'test' }, comparisons: [view] }, 'Comparison')!;
    expect(csv.split('\n')[0]).toMatch(/^# /);
    expect(csv).toMatch(/UA ratio/);
  });
});
