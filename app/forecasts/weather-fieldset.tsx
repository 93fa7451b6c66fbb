'use client';

import { HourSelect, NumberField } from './forecast-fields';
import type { ForecastChoices } from './forecast-request';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnit, displayUnits } from '@/app/_contracts/units';

/** Weather and cover: losses on or off, constant weather or an hourly CSV table (read in the browser), and the cover hours. */
export function WeatherFieldset({ units, choices, set, readWeather }: { units: UnitSystem; choices: ForecastChoices; set: (patch: Partial<ForecastChoices>) => void; readWeather: (file: File | undefined) => void }) {
  const us = units === 'us';
  const u = displayUnits(units);
  const speed = displayUnit('speed', units);
  const { losses, weatherMode, table } = choices;
  return (
    <fieldset className="card space-y-3 p-4">
      <legend className="px-1 font-semibold">Weather and cover</legend>
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" checked={losses} onChange={(e) => set({ losses: e.target.checked })} /> include losses (evaporation, convection, radiation) and sun
      </label>
      {losses ? (
        <div className="space-y-3">
          <div className="flex gap-4 text-sm" role="radiogroup" aria-label="Weather">
            <label className="flex items-center gap-1.5">
              <input type="radio" name="weatherMode" checked={weatherMode === 'constant'} onChange={() => set({ weatherMode: 'constant' })} /> constant
            </label>
            <label className="flex items-center gap-1.5">
              <input type="radio" name="weatherMode" checked={weatherMode === 'hourly'} onChange={() => set({ weatherMode: 'hourly' })} /> hourly table (CSV)
            </label>
          </div>
          {weatherMode === 'constant' ? (
            <div className="grid grid-cols-2 gap-3">
              <NumberField name="airTemp" label="Air" def={us ? '72' : '22'} unit={u.temp.label} />
              <NumberField name="rh" label="Humidity" def="60" unit="%" />
              <NumberField name="wind" label="Wind" def={us ? '2' : '1'} unit={speed.label} />
              <NumberField name="solar" label="Mean sun" def="150" unit="W/m²" />
            </div>
          ) : (
            <div className="space-y-2 text-sm">
              <input type="file" accept=".csv,.txt,.tsv,text/csv" aria-label="Hourly weather CSV" className="block w-full text-sm" onChange={(e) => void readWeather(e.target.files?.[0])} />
              <p className="text-xs text-ink-muted">
                One row per hour from the start: air temperature and relative humidity (or dew point) required; wind, sun (W/m²) and cloud cover optional. Units from the headers, e.g. “air (°F)”, “wind (mph)”. A shorter table repeats.
              </p>
              {table ? (
                table.issues.length ? (
                  <ul role="alert" className="space-y-0.5 rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">
                    {table.issues.slice(0, 8).map((i) => (
                      <li key={`${i.line}-${i.message}`}>
                        {table.name}, line {i.line}: {i.message}
                      </li>
                    ))}
                  </ul>
                ) : (
                  <p className="text-ok-text" role="status">
                    {table.name}: {table.rows.length} hourly row{table.rows.length === 1 ? '' : 's'} ({table.columns.map((c) => c.meaning).join('; ')}).
                  </p>
                )
              ) : null}
            </div>
          )}
          <div className="grid grid-cols-[auto_1fr_1fr] items-end gap-3 text-sm">
            <label className="flex items-center gap-2 pb-2">
              <input type="checkbox" name="cover" defaultChecked /> cover on
            </label>
            <HourSelect name="coverFrom" label="from" def={20} fullName="Cover on from" />
            <HourSelect name="coverTo" label="to" def={7} fullName="Cover off at" />
          </div>
        </div>
      ) : null}
    </fieldset>
  );
}
