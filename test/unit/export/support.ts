/**
 * A small study for the workbook tests: 9 trials of the constant-source coil of DOMAIN.md §1.2
 * (Ts 90 °C, Tin 20 °C, UA 500 W/K, 1000 kg/m³, 4186 J/(kg·K)) from 2 to 18 L/min with fixed
 * deviations of a few tenths of a kelvin, the coil and exp-inlet fits, a performance table, a
 * loss-free 12-hour forecast and a cost sheet.
 */
import { fitModel, type FitSuccess } from '../../../analysis/fit';
import { performanceTable } from '../../../analysis/performance/performance-table';
import { heaterFromFit } from '../../../analysis/performance/fitted-heater';
import { recirculatingForecast } from '../../../analysis/forecast/recirculating-forecast';
import { buildCostSheet } from '../../../analysis/cost/build-cost';
import { costPerDegree, usefulHeatCost } from '../../../analysis/cost/useful-heat-cost';
import { payback } from '../../../analysis/cost/payback';
import { deriveTrial } from '../../../analysis/trial/derive-trial';
import { trialExportRow } from '../../../app/_lib/exports/trial-sheet';
import type { StudyExport, TrialExportRow } from '../../../app/_lib/exports/types';
import type { UnitSystem } from '../../../analysis/units/unit-system';

export const LPM = 1 / 60000; // m³/s per L/min (NIST SP 811: 1 L = 10⁻³ m³ exactly)
const DEVIATIONS_K = [0.21, -0.34, 0.12, 0.05, -0.27, 0.31, -0.08, -0.18, 0.16];

export const flowsLpm = [2, 4, 6, 8, 10, 12, 14, 16, 18];
export const outletTempC = flowsLpm.map((q, i) => 90 - 70 * Math.exp(-500 / (1000 * q * LPM * 4186)) + DEVIATIONS_K[i]);

function fit(model: string): FitSuccess {
  const n = flowsLpm.length;
  const r = fitModel({
    x: flowsLpm.map((q) => q * LPM), y: outletTempC, model,
    covariates: { Tin: Array(n).fill(20), rho: Array(n).fill(1000), cp: Array(n).fill(4186) },
  });
  if (!r.ok) throw new Error(`${model}: ${r.reason}`);
  return r;
}

export const coil = fit('coil');
export const expInlet = fit('exp-inlet');

export const trials: TrialExportRow[] = flowsLpm.map((q, i) => {
  const input = { flowM3PerS: q * LPM, inletTempC: 20, outletTempC: outletTempC[i], sourceTempC: 95 };
  return trialExportRow({
    id: `T${i + 1}`, order: i + 1, timestamp: new Date(Date.UTC(2026, 5, 1, 9, 15 * i)), steady: true, included: true,
    bucketVolumeM3: 0.01, fillTimesS: [600 / q, 600 / q + 0.4], ambientTempC: -2.5,
    notes: i === 0 ? '=HYPERLINK("http://127.0.0.1/x","open")' : i === 1 ? '@SUM(A1)' : i === 2 ? '-fuel added' : 'calm',
  }, input, deriveTrial(input));
});

export const perf = performanceTable(coil, [3, 9, 15, 24].map((q) => q * LPM), 20);
export const forecast = recirculatingForecast({
  poolVolumeM3: 10, startTempC: 18, hours: 12, flowM3PerS: 10 * LPM, heater: heaterFromFit(coil), losses: false, targetTempC: 30,
});

export function study(unitSystem: UnitSystem): StudyExport {
  return {
    unitSystem,
    provenance: {
      lab: 'Demo lab', rig: '+rig with a formula-looking name', study: 'Coil study', model: 'coil',
      fitTime: new Date('2026-06-01T12:00:00Z'), softwareVersion: '0.1.0', dataHash: 'ab12cd34',
      exportedAt: new Date('2026-06-02T08:00:00Z'), settings: { 'Confidence level': 0.95, 'Steady-state preset': 'default' },
    },
    trials,
    fits: [{ fit: coil, pointIds: trials.map((t) => t.id) }, { label: 'exp-inlet', fit: expInlet }],
    performance: [{ table: perf }],
    forecasts: [{ label: '10 L/min', result: forecast, startTime: new Date('2026-06-03T08:00:00Z') }],
    costs: {
      currency: 'USD',
      build: buildCostSheet([
        { subassembly: 'coil', description: 'copper tube 3/8 in, 50 ft', quantity: 2, unitCost: 48.5 },
        { subassembly: 'coil', description: 'fittings', quantity: 6, unitCost: 2.25 },
        { subassembly: 'labour', description: 'bending and testing', quantity: 3, unitCost: 20, taxable: false },
      ], 0.08),
      usefulHeat: { fuel: 'propane', ...usefulHeatCost({ fuel: 'propane', pricePerUnit: 2.5 }) },
      perDegree: costPerDegree(10, 3),
      payback: payback({ capitalCost: 600, annualUsefulHeatJ: 500 * 105.5e6, perUsefulThermThis: 0.4, perUsefulThermOther: 1.83 }),
    },
    notes: ['Reviewed: changes requested on 2026-06-02.'],
  };
}
