/**
 * A HeaterModel for the pool forecast from a fit: the coil fit becomes the physical coil (it
 * carries over to a warming pool through its effectiveness); an empirical fit is evaluated as
 * fitted, flagged as not transferable to other inlet temperatures.
 */
import type { FitSuccess } from '../fit';
import { fastCpJPerKgK, fastDensityKgPerM3 } from '../water/property-table';
import { coilHeater, type HeaterModel } from './heater-model';
import { fittedCurve } from './fitted-curve';

/**
 * @param fit a successful heater fit (x = volume flow m³/s, y = outlet °C)
 * @param options.sourceTempC for an empirical fit, a known source temperature Ts (°C): the
 *   fitted curve is then re-referenced through its effectiveness at the fitted inlet,
 *   ε(V̇) = (f(V̇) − T_fit)/(Ts − T_fit), and Tout = Tin + ε·(Ts − Tin) (DOMAIN.md §0 item 2, §3.3);
 *   without it the curve is used as fitted, which over-predicts the heating of a warming pool.
 * @param options.fittedInletC the inlet temperature of the trials when the fit had no Tin covariate
 * @throws RangeError when re-referencing is asked without a fitted inlet, or Ts ≤ T_fit.
 * @example recirculatingForecast({ ..., heater: heaterFromFit(fit) })
 */
export function heaterFromFit(fit: FitSuccess, options: { sourceTempC?: number; fittedInletC?: number } = {}): HeaterModel {
  if (fit.model === 'coil') return coilHeater({ sourceTempC: fit.params.Ts.value, uaWPerK: fit.params.UA.value });
  const curve = fittedCurve(fit);
  const p = curve.values;
  const range = curve.fittedInletRangeC;
  const tFit = options.fittedInletC ?? (range ? (range[0] + range[1]) / 2 : null);
  const x = [0];
  const raw = (flow: number, tin: number) => { x[0] = flow; return curve.evaluate(p, x, tin)[0]; };
  const capacity = (flow: number, tin: number) => fastDensityKgPerM3(tin) * flow * fastCpJPerKgK(tin);
  if (options.sourceTempC !== undefined) {
    const Ts = options.sourceTempC;
    if (tFit === null) throw new RangeError('fittedInletC is required to re-reference an empirical fit without a Tin covariate');
    if (!(Ts > tFit)) throw new RangeError(`sourceTempC (${Ts}) must be above the fitted inlet temperature (${tFit})`);
    return {
      name: `${fit.model} (re-referenced)`, inletTransferable: true, fittedInletC: tFit, sourceTempC: Ts,
      outletTempC(flowM3PerS: number, inletTempC: number): number {
        const eps = (raw(flowM3PerS, tFit) - tFit) / (Ts - tFit);
        return inletTempC + eps * (Ts - inletTempC);
      },
      heatW(flowM3PerS: number, inletTempC: number): number {
        if (!(flowM3PerS > 0)) return 0;
        const eps = (raw(flowM3PerS, tFit) - tFit) / (Ts - tFit);
        return eps * capacity(flowM3PerS, inletTempC) * (Ts - inletTempC);
      },
    };
  }
  return {
    name: fit.model,
    inletTransferable: false,
    fittedInletC: tFit,
    sourceTempC: null,
    outletTempC: raw,
    heatW: (flowM3PerS: number, inletTempC: number) => (flowM3PerS > 0 ? capacity(flowM3PerS, inletTempC) * (raw(flowM3PerS, inletTempC) - inletTempC) : 0),
  };
}
