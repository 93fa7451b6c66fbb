/** `forecast`: recirculating pool heat-up with optional losses. */
import { readingInput } from '../units/reading-input';
import { recirculatingForecast } from '../forecast/recirculating-forecast';
import { readForecastInput } from '../forecast/read-forecast-input';
import { forecastJson, forecastSeriesJson } from '../forecast/forecast-json';

export const help = `recirculating pool forecast: the pool feeds the heater inlet, stepped in time
input: {"poolVolume":"40 m^3","startTemp":"18 degC","hours":24,"flow":"9 L/min",
        "heater":{"model":"coil","sourceTemp":"88 degC","UA":"430 W/K"},"losses":false}
  heater: {"model":"coil","sourceTemp","UA"} | {"model":"fixed-rise","rise":"10 K"}
  optional: "poolMass":"40000 kg" (instead of poolVolume), "volumeTemp":"26 degC" (water temperature the volume
  was measured at, default startTemp), "step":"60 s", "targetTemp":"28 degC", "thermostat":true (heater off at the target), "heaterHours":[8,...,17], "startHour":0
  losses: false | {"surfaceArea":"46.6 m^2", "weather": {"airTemp":"20 degC","relativeHumidity":0.6 | "dewPoint":"12 degC",
           "wind":"1 m/s","solar":"200 W/m^2","cloudCover":0.5,"skyTemp":"5 degC"} or an hourly array of them,
           "evaporation": false | {"activityFactor":1,"correction":0.8}, "convection": false | {"model":"mcadams"},
           "radiation": false | {"emissivity":0.95}, "solar": false | {"absorptance":0.85},
           "walls": {"area":"30 m^2","U":"1.5 W/(m^2 K)","groundTemp":"15 degC"},
           "cover": {"coveredHours":[0,1,2,22,23],"evaporationFactor":0.1,"solarFactor":0.8}}
output: {"finalTemp_degC", "maxTemp_degC", "maxOutletTemp_degC", "hoursToTarget_h", "equilibriumTemp_degC",
         "energy_J": {...}, "evaporated_kg", "series": [{"time_h","temp_degC","outletTemp_degC"}], "cautions"}`;

export function run(input: unknown): unknown {
  return readingInput((read) => {
    const r = recirculatingForecast(readForecastInput(read, input));
    return { ...forecastJson(r), series: forecastSeriesJson(r) };
  });
}
