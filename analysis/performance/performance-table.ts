/**
 * Performance table of a fitted heater (DOMAIN.md §1, §7): at chosen flow steps and one inlet
 * temperature, the predicted outlet temperature, ΔT and heat rate with the fit's confidence and
 * prediction intervals; rows outside the tested flow range flagged as extrapolated; cautions on
 * every outlet temperature. q = ρ(Tin)·V̇·cp·(Tout − Tin) with cp at the mean water temperature;
 * the inlet is given, so the intervals on q map linearly from those on Tout.
 */
import type { FitSuccess } from '../fit';
import { requireFiniteArray, requireInRange, requirePositive } from '../units/guards';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../water/water-properties';
import { mergeCautions, temperatureCautions, type Caution } from '../safety/cautions';
import { fittedCurve } from './fitted-curve';

/** One row of the table. */
export interface PerformanceRow {
  flowM3PerS: number;
  outletTempC: number;
  outletCiC: [number, number];
  outletPiC: [number, number];
  deltaTK: number;
  heatW: number;
  heatCiW: [number, number];
  heatPiW: [number, number];
  /** standard error of the mean heat rate, W (the outlet's, scaled like the heat) */
  heatSeW: number;
  extrapolated: boolean;
  cautions: Caution[];
}

/** The table with its notes. */
export interface PerformanceTable {
  model: string;
  inletTempC: number;
  level: number;
  rows: PerformanceRow[];
  /** the model is physical (coil) and carries over to any inlet temperature */
  inletTransferable: boolean;
  notes: string[];
  cautions: Caution[];
}

/**
 * The capacity rate that turns a temperature rise into delivered heat, the table's rule:
 * ρ(Tin)·V̇·cp(Tm), cp at the mean water temperature (clamped to 0–100 °C), so q = that × (Tout − Tin).
 * @param flowM3PerS volume flow, m³/s
 * @param inletTempC °C
 * @param outletTempC °C (for the mean temperature of cp)
 * @param densityKgPerM3 ρ(Tin) when already known
 * @returns W/K
 * @throws RangeError for an inlet outside the liquid range
 * @example heatPerKelvinWPerK(1.5e-4, 17.5, 52.5) * (52.5 - 17.5) // ≈ 21.9 kW (the demo lab's Stovepipe Coil A at 9 L/min)
 */
export function heatPerKelvinWPerK(flowM3PerS: number, inletTempC: number, outletTempC: number, densityKgPerM3 = waterDensityKgPerM3(inletTempC, undefined, 'inletTempC')): number {
  return densityKgPerM3 * flowM3PerS * waterCpJPerKgK(Math.min(Math.max((inletTempC + outletTempC) / 2, 0), 100));
}

/**
 * @param fit a successful fit (heater built-ins: x = volume flow m³/s, y = outlet °C)
 * @param flowsM3PerS flow steps, m³/s, each > 0
 * @param inletTempC inlet temperature for the table, °C
 * @param options.level interval level (default the fit's); options.fittedInletC the inlet
 *   temperature of the trials when the model has no Tin covariate (for the note)
 * @throws TypeError / RangeError for empty or non-positive flows, an inlet outside the water range.
 * @example performanceTable(fit, [1e-4, 2e-4, 3e-4], 20).rows[0].heatW
 */
export function performanceTable(
  fit: FitSuccess, flowsM3PerS: number[], inletTempC: number, options: { level?: number; fittedInletC?: number } = {},
): PerformanceTable {
  const flows = requireFiniteArray(flowsM3PerS, 'flowsM3PerS');
  flows.forEach((f, i) => requirePositive(f, `flowsM3PerS[${i}]`));
  const rho = waterDensityKgPerM3(inletTempC, undefined, 'inletTempC');
  const level = requireInRange(options.level ?? fit.level, 'level', 0.5, 0.9999);
  const curve = fittedCurve(fit);
  const band = curve.band(flows, inletTempC, level);
  const rows = band.map((b, i): PerformanceRow => {
    const k = heatPerKelvinWPerK(flows[i], inletTempC, b.y, rho);
    return {
      flowM3PerS: flows[i], outletTempC: b.y, outletCiC: [b.ciLow, b.ciHigh], outletPiC: [b.piLow, b.piHigh],
      deltaTK: b.y - inletTempC, heatW: k * (b.y - inletTempC),
      heatCiW: [k * (b.ciLow - inletTempC), k * (b.ciHigh - inletTempC)], heatPiW: [k * (b.piLow - inletTempC), k * (b.piHigh - inletTempC)],
      heatSeW: k * b.seMean,
      extrapolated: b.extrapolated, cautions: temperatureCautions(b.piHigh, 'outlet'),
    };
  });
  const notes: string[] = [];
  const [lo, hi] = curve.xRange;
  if (rows.some((r) => r.extrapolated)) {
    notes.push(`Rows outside the tested flows (${(lo * 60000).toFixed(2)}–${(hi * 60000).toFixed(2)} L/min) are extrapolated: treat them with caution.`);
  }
  if (curve.inletTransferable) {
    notes.push('The coil model is physical: it carries over to any inlet temperature.');
  } else {
    const r = curve.fittedInletRangeC ?? (options.fittedInletC !== undefined ? [options.fittedInletC, options.fittedInletC] : null);
    const at = r ? (r[1] - r[0] < 1 ? `${((r[0] + r[1]) / 2).toFixed(1)} °C` : `${r[0].toFixed(1)}–${r[1].toFixed(1)} °C`) : 'the trials’ inlet temperature';
    notes.push(`The ${fit.model} model is empirical: it holds only at the inlet temperature it was fitted at (${at}). Fit the coil model to predict at other inlet temperatures.`);
  }
  notes.push('Cautions use the upper prediction bound of each outlet temperature.');
  return {
    model: fit.model, inletTempC, level, rows, inletTransferable: curve.inletTransferable, notes,
    cautions: mergeCautions(...rows.map((r) => r.cautions)),
  };
}
