/**
 * The Tub fill sheet and the Costs sheet's Season rows (app/_lib/exports): values in the reader's
 * units (US gallon 3.785411784 L and °F = °C × 1.8 + 32, NIST SP 811), the fill time in minutes,
 * the safety notice first and the Caution cell in words (the 40/49/60 °C limits of DOMAIN.md §5).
 */
import { describe, expect, test } from 'vitest';
import { tubFillSheet } from '../../../app/_lib/exports/tub-fill-sheet';
import { costsSheet } from '../../../app/_lib/exports/result-sheets';
import type { SeasonView, TubFillView } from '../../../app/_contracts/study-blocks';

const fill: TubFillView = {
  tubVolumeM3: 1.2, flowM3PerS: 1e-4, supplyTempC: 15, fillTimeS: 12_000, outletTempC: 70, finalTempC: 70,
  target: { targetTempC: 38, outletTempC: 38, flowM3PerS: 3e-4, fillTimeS: 4000, note: 'The flow at which the outlet gives the target after mixing.' },
  heaterNote: 'Heater: Ts 88 °C, UA 430 W/K.', cautions: [],
};

describe('the Tub fill sheet', () => {
  test('one row per block in US units, the fill in minutes, the notice and the caution in words', () => {
    const sheet = tubFillSheet([{ label: 'Tub fill (block 3)', fill }], 'us');
    expect(sheet.name).toBe('Tub fill');
    const r = sheet.rows[0];
    expect(r.volume as number).toBeCloseTo(1200 / 3.785411784, 6);
    expect(r.supply as number).toBeCloseTo(59, 9);
    expect(r.fillMin).toBe(200);
    expect(r.targetFillMin as number).toBeCloseTo(4000 / 60, 9);
    expect(r.final as number).toBeCloseTo(158, 9);
    expect(String(r.caution)).toMatch(/at or above 140 °F/);
    expect(sheet.notice![0]).toMatch(/^Safety/);
    expect(sheet.notice!.join(' ')).toMatch(/tub/i);
  });
});

describe('the Season rows of the Costs sheet', () => {
  const season: SeasonView = {
    days: 120, hoursPerDay: 8, targetTempC: 28, cover: true, lossW: 1300, solarW: 0, netLossW: 1300, heaterW: 20_000, holdHoursPerDay: 1.56, limitedByHeater: false,
    usefulJ: 1.35e10, fuelJ: 4.5e10, fuelUnits: 2.13, fuelUnit: 'cord', fuelKWh: 12_500, fuelTherms: 426.5, burnerHours: 960, poolHours: 2880, annualCost: 533, currency: 'USD',
    payback: { buildCost: 180, buildBasis: 'the build price given', purchasedPrice: 1800, purchasedFuel: 'propane', purchasedEfficiency: 0.82, perUsefulThermBuild: 4.17, perUsefulThermPurchased: 4.67, annualCostBuild: 533, annualCostPurchased: 597, annualSaving: 64, years: 0, verdict: 'At once: …' },
    notes: [], cautions: [],
  };
  test('a season of a running-cost group lists its heat, fuel, money and payback', () => {
    const sheet = costsSheet({ currency: 'USD', running: [{ label: 'Cost sheet (block 2)', fuel: 'wood', currency: 'USD', price: 250, priceUnit: 'cord', efficiency: 0.3, perUsefulTherm: 4.17, perUsefulKWh: 0.14, perDegF: null, perK: null, heatJ: 1e9, heatCost: 40, fuelQuantity: 0.16, heatBasis: 'given', season }] }, 'si');
    const rows = sheet.rows.filter((r) => r.section === 'Season');
    const item = (name: string) => rows.find((r) => r.item === name)?.amount;
    expect(item('Season length')).toBe(120);
    expect(item('Running cost of the season')).toBe(533);
    expect(item('Fuel bought (cord)')).toBe(2.13);
    expect(item('Mean losses at the target') as number).toBeCloseTo(1.3, 9); // kW
    expect(item('Payback')).toBe(0);
    expect(item('Payback in words')).toMatch(/^At once/);
  });
});
