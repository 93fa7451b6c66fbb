import { describe, expect, test } from 'vitest';
import * as coil from '../../../analysis/cli/coil';
import * as fit from '../../../analysis/cli/fit';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../../../analysis/water/water-properties';

type Out = Record<string, any>;

// One water rule for trials (DOMAIN.md §1.1): the bucket holds outlet water, so ṁ = ρ(Tout)·V̇, and
// cp at the mean water temperature (IAPWS-IF97). A UA fitted from trials must predict those trials
// back through the `coil` command, and the `coil` command's outlets must fit back to its UA.
describe('the fit and coil commands use the same water and agree on UA (IAPWS-IF97, DOMAIN.md §1.1)', () => {
  const sourceTemp = '88 degC', inletTemp = '17.5 degC', UA = '430 W/K'; // the demo lab's Stovepipe Coil A
  const flowsLpm = [3, 4.5, 6, 7.5, 9, 12, 15, 18, 21];
  const outlets = flowsLpm.map((q) => (coil.run({ sourceTemp, inletTemp, UA, flow: `${q} L/min` }) as Out).outletTemp_degC as number);

  test('fitting the coil command\'s outlets without rho and cp gives back its UA and Ts to 1e-8', () => {
    const out = fit.run({ x: flowsLpm.map((q) => q / 60000), y: outlets, model: 'coil', covariates: { Tin: flowsLpm.map(() => 17.5) } }) as Out;
    expect(out.ok).toBe(true);
    expect(Math.abs(out.params.UA.value / 430 - 1)).toBeLessThan(1e-8);
    expect(Math.abs(out.params.Ts.value / 88 - 1)).toBeLessThan(1e-8);
    expect(out.warnings.join(' ')).toMatch(/IAPWS-IF97 density at each outlet/);
  });
  test('the coil command uses ρ at the outlet and cp at the mean', () => {
    const r = coil.run({ sourceTemp, inletTemp, UA, flow: '9 L/min' }) as Out;
    expect(r.density_kg_per_m3).toBeCloseTo(waterDensityKgPerM3(r.outletTemp_degC), 10);
    expect(r.cp_J_per_kg_K).toBeCloseTo(waterCpJPerKgK((17.5 + r.outletTemp_degC) / 2), 8);
  });
});
