/**
 * A HeaterModel for the pool forecast from a fit: the coil fit becomes the physical coil (it
 * carries over to a warming pool through its effectiveness); an empirical fit is evaluated as
 * fitted, flagged as not transferable to other inlet temperatures.
 */
import type { FitSuccess } from '../fit';
import { coilHeater, type HeaterModel } from './heater-model';
import { fittedCurve } from './fitted-curve';

/**
 * @param fit a successful heater fit (x = volume flow m³/s, y = outlet °C)
 * @example recirculatingForecast({ ..., heater: heaterFromFit(fit) })
 */
export function heaterFromFit(fit: FitSuccess): HeaterModel {
  if (fit.model === 'coil') return coilHeater({ sourceTempC: fit.params.Ts.value, uaWPerK: fit.params.UA.value });
  const curve = fittedCurve(fit);
  const p = curve.values;
  const range = curve.fittedInletRangeC;
  const x = [0];
  return {
    name: fit.model,
    inletTransferable: false,
    fittedInletC: range ? (range[0] + range[1]) / 2 : null,
    sourceTempC: null,
    outletTempC(flowM3PerS: number, inletTempC: number): number {
      x[0] = flowM3PerS;
      return curve.evaluate(p, x, inletTempC)[0];
    },
  };
}
