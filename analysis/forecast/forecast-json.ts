/**
 * The JSON of a forecast result, units in the names (`finalTemp_degC`, `energy_J`): the one shape
 * the command line prints and the app's forecast route answers.
 * @example forecastJson(recirculatingForecast(input)).finalTemp_degC
 */
import type { ForecastResult } from './recirculating-forecast';

export function forecastJson(r: ForecastResult) {
  const e = r.energy;
  return {
    finalTemp_degC: r.finalTempC, maxTemp_degC: r.maxTempC, maxOutletTemp_degC: r.maxOutletTempC, poolMass_kg: r.poolMassKg,
    hoursToTarget_h: r.hoursToTarget, equilibriumTemp_degC: r.equilibriumTempC, equilibriumNote: r.equilibriumNote,
    holdHoursPerDay_h: r.holdHoursPerDay, holdNote: r.holdNote,
    energy_J: { heater_J: e.heaterJ, solar_J: e.solarJ, evaporation_J: e.evaporationJ, convection_J: e.convectionJ, radiation_J: e.radiationJ, walls_J: e.wallsJ, net_J: e.netJ },
    evaporated_kg: e.evaporatedKg, steps: r.steps, cautions: r.cautions,
  };
}

/** The trajectory as rows (for the command line). */
export function forecastSeriesJson(r: ForecastResult) {
  return Array.from(r.timeH, (t, i) => ({ time_h: t, temp_degC: r.tempC[i], outletTemp_degC: r.outletTempC[i] }));
}
