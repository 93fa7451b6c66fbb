/**
 * A measured day against its forecast, with the uncertainty of the gain the model did not
 * include (first-order GUM, JCGM 100:2008 §5.1, DOMAIN.md §2.5): the residual r = Tend,obs −
 * Tend,pred depends on both thermometer readings (the start through the forecast, with the
 * sensitivity ∂Tend,pred/∂T0 found by running the forecast again from T0 + δ) and the gain
 * G = r·M·cp on the pool's mass, whose uncertainty comes from the volume (∂G/∂M, with the
 * forecast run again on M·(1 + δ)). The readings are independent: the terms add in quadrature.
 * The verdict compares |G| with its expanded uncertainty (k = 2).
 */
import { requireNonNegative } from '../units/guards';
import { fastCpJPerKgK } from '../water/property-table';
import { measuredDay, type MeasuredDayResult } from './measured-day';
import { recirculatingForecast, type ForecastInput } from './recirculating-forecast';

/** Standard uncertainties of the measurement. */
export interface MeasuredDayUncertainty {
  /** of each thermometer reading (start and end), K */
  thermometerK: number;
  /** of the pool volume (hence mass), as a fraction */
  volumeRelative: number;
}

/** The comparison with its uncertainty and a verdict in plain words. */
export interface MeasuredDayCheck extends MeasuredDayResult {
  /** standard uncertainty of the residual, K */
  residualUK: number;
  /** standard uncertainty of the unmodelled gain, J and mean W */
  gainUJ: number;
  gainUW: number;
  /** |gain| > 2·u(gain) */
  significant: boolean;
  verdict: string;
}

/**
 * @param input the forecast of the day (its start temperature is the measured start, its heater hours the hours the heater ran)
 * @param observedEndC the measured end temperature, °C
 * @param u standard uncertainties (thermometer K, volume fraction)
 * @throws as `recirculatingForecast`; RangeError for negative uncertainties
 * @example measuredDayCheck(input, 27.4, { thermometerK: 0.3, volumeRelative: 0.05 }).verdict
 */
export function measuredDayCheck(input: ForecastInput, observedEndC: number, u: MeasuredDayUncertainty): MeasuredDayCheck {
  const uT = requireNonNegative(u.thermometerK, 'thermometerK');
  const uV = requireNonNegative(u.volumeRelative, 'volumeRelative');
  const day = measuredDay(input, observedEndC);
  const M = day.forecast.poolMassKg;
  // the heat capacity measuredDay uses
  const cp = input.fixedCpJPerKgK ?? fastCpJPerKgK((day.observedEndC + day.predictedEndC) / 2);
  const dT = 0.01;
  const fromStart = recirculatingForecast({ ...input, startTempC: input.startTempC + dT });
  const sStart = (fromStart.finalTempC - day.predictedEndC) / dT;
  const uRes = Math.hypot(uT, sStart * uT);
  let dGdM = day.residualK * cp;
  if (uV > 0) {
    const k = 1e-3;
    const bigger = recirculatingForecast(massScaled(input, 1 + k));
    const dPred = (bigger.finalTempC - day.predictedEndC) / (M * k);
    dGdM = (day.observedEndC - day.predictedEndC) * cp - M * cp * dPred;
  }
  const gainUJ = Math.hypot(M * cp * uRes, dGdM * uV * M);
  const seconds = input.hours * 3600;
  const significant = Math.abs(day.unmodelledGainJ) > 2 * gainUJ;
  const kWh = (j: number) => (j / 3.6e6).toFixed(1);
  const w = (x: number) => x.toFixed(0);
  const verdict = !significant
    ? `Within the measurement uncertainty: the pool ended ${day.residualK >= 0 ? day.residualK.toFixed(2) : (-day.residualK).toFixed(2)} K ${day.residualK >= 0 ? 'above' : 'below'} the forecast, and ±${(2 * uRes).toFixed(2)} K (k = 2) is what the thermometers and the volume allow: the forecast accounts for the day.`
    : day.unmodelledGainJ > 0
      ? `The pool gained about ${kWh(day.unmodelledGainJ)} kWh (${w(day.unmodelledGainJ / seconds)} W on average) more than the forecast, beyond the measurement uncertainty of ±${kWh(2 * gainUJ)} kWh (k = 2): sun on the water that the weather did not carry, or losses over-estimated (a cover, less wind).`
      : `The pool lost about ${kWh(-day.unmodelledGainJ)} kWh (${w(-day.unmodelledGainJ / seconds)} W on average) more than the forecast, beyond the measurement uncertainty of ±${kWh(2 * gainUJ)} kWh (k = 2): losses under-estimated (wind, evaporation, a cover off), or the heater gave less than its fit.`;
  return { ...day, residualUK: uRes, gainUJ, gainUW: gainUJ / seconds, significant, verdict };
}

/** The same forecast on a pool of `factor` × the mass (volume or mass, whichever the input gives). */
function massScaled(input: ForecastInput, factor: number): ForecastInput {
  if (input.poolMassKg !== undefined) return { ...input, poolMassKg: input.poolMassKg * factor };
  if (input.poolVolumeM3 !== undefined) return { ...input, poolVolumeM3: input.poolVolumeM3 * factor };
  return input;
}
