/**
 * A measured day: run the forecast from an observed start temperature over the observed period
 * and compare its end with the observed end. The residual (observed − predicted), times the
 * pool's heat capacity, is the energy the model did not account for — sun on the water, an
 * unrecorded heater run, a wrong loss assumption — reported in J, mean W and W/m².
 */
import { requireFinite } from '../units/guards';
import { fastCpJPerKgK } from '../water/property-table';
import { recirculatingForecast, type ForecastInput, type ForecastResult } from './recirculating-forecast';

/** The comparison of a forecast with a measured day. */
export interface MeasuredDayResult {
  predictedEndC: number;
  observedEndC: number;
  /** observed − predicted, K */
  residualK: number;
  /** residual × M·cp, J (positive: more heat arrived than modelled) */
  unmodelledGainJ: number;
  /** over the period, W */
  unmodelledGainW: number;
  /** per m² of water surface, W/m² (null without a surface area) */
  unmodelledGainWPerM2: number | null;
  forecast: ForecastResult;
}

/**
 * @param input the forecast of the day; its `startTempC` is the observed start
 * @param observedEndC the observed end temperature, °C
 * @throws as `recirculatingForecast`; TypeError for a non-finite observed end.
 * @example measuredDay({ ...forecastInput, startTempC: 24.1, hours: 24 }, 25.3).unmodelledGainW
 */
export function measuredDay(input: ForecastInput, observedEndC: number): MeasuredDayResult {
  const end = requireFinite(observedEndC, 'observedEndC');
  const forecast = recirculatingForecast(input);
  const residual = end - forecast.finalTempC;
  const cp = input.fixedCpJPerKgK ?? fastCpJPerKgK((end + forecast.finalTempC) / 2);
  const gainJ = residual * forecast.poolMassKg * cp;
  const gainW = gainJ / (input.hours * 3600);
  const area = input.losses ? input.losses.surfaceAreaM2 : null;
  return {
    predictedEndC: forecast.finalTempC, observedEndC: end, residualK: residual,
    unmodelledGainJ: gainJ, unmodelledGainW: gainW, unmodelledGainWPerM2: area ? gainW / area : null, forecast,
  };
}
