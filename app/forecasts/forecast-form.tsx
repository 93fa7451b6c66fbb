'use client';

import { useState } from 'react';
import { api, ApiError } from '../_components/api';
import { CautionList, TempValue } from '../_components/safety-notice';
import { PlotFigure } from '../_components/plot-figure';
import { displayUnit, displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { parseWeatherCsv, type WeatherTable } from './weather-csv';

/** Hours of the day from `from` up to (not including) `to`, wrapping past midnight; from = to is all day. */
function hoursBetween(from: number, to: number): number[] {
  const out: number[] = [];
  for (let h = from; out.length < 24; h = (h + 1) % 24) {
    if (out.length && h === to) break;
    out.push(h);
  }
  return out;
}
const HOURS = Array.from({ length: 24 }, (_, h) => h);
const hh = (h: number) => `${String(h).padStart(2, '0')}:00`;

interface Result {
  finalTemp_degC: number;
  maxOutletTemp_degC: number;
  hoursToTarget_h: number | null;
  equilibriumTemp_degC: number | null;
  equilibriumNote?: string;
  evaporated_kg: number;
  fitNote: string | null;
  pool: { volume_m3: number; area_m2: number } | null;
  cautions: { code: string; level: string; message: string }[];
  riseTable: { flowsM3PerS: number[]; volumesM3: number[]; risePerHourK: number[][] } | null;
  cost: { perUsefulTherm: number; perDegF: number; perK: number; forecastHeatCost: number } | null;
  plots: Record<'trajectory' | 'budget', { title: string; summary: string; svg: string }>;
}

/** Pool or tub warm-up forecast: shape and size, temperatures, flow, heater (a saved coil fit or Ts/UA), weather and cover. */
export function ForecastForm({ labId, units, fits }: { labId: string; units: UnitSystem; fits: { id: string; label: string }[] }) {
  const us = units === 'us';
  const u = displayUnits(units);
  const length = displayUnit('length', units), speed = displayUnit('speed', units), poolVolume = displayUnit('poolVolume', units), area = displayUnit('area', units);
  const L = length.mathUnit;
  const T = u.temp.mathUnit;
  const [res, setRes] = useState<Result | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [shape, setShape] = useState('round');
  const [losses, setLosses] = useState(true);
  const [weatherMode, setWeatherMode] = useState<'constant' | 'hourly'>('constant');
  const [table, setTable] = useState<(WeatherTable & { name: string }) | null>(null);

  async function readWeather(file: File | undefined) {
    if (!file) return;
    if (file.size > 2 * 1024 * 1024) {
      setTable({ name: file.name, rows: [], columns: [], issues: [{ line: 1, message: `the file is ${(file.size / 1024 / 1024).toFixed(1)} MB; an hourly table for a year is under 1 MB` }] });
      return;
    }
    setTable({ name: file.name, ...parseWeatherCsv(await file.text(), units) });
  }

  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const v = (k: string) => String(f.get(k) ?? '').trim().replace(',', '.');
    const q = (k: string, unit: string) => (v(k) ? `${v(k)} ${unit}` : undefined);
    const pool: Record<string, unknown> = { shape, depth: q('depth', L) };
    if (shape === 'round') pool.diameter = q('diameter', L);
    else Object.assign(pool, { length: q('length', L), width: q('width', L) });
    const hourly = weatherMode === 'hourly';
    if (losses && hourly && !(table && table.rows.length && !table.issues.length)) {
      setError('Choose an hourly weather table without errors, or use constant weather.');
      return;
    }
    const heaterHours = hoursBetween(Number(v('heaterFrom')), Number(v('heaterTo')));
    const body: Record<string, unknown> = {
      pool,
      startHour: Number(v('startHour')),
      ...(heaterHours.length < 24 ? { heaterHours } : {}),
      startTemp: q('startTemp', T),
      targetTemp: q('targetTemp', T),
      hours: Number(v('hours')),
      flow: q('flow', u.flow.mathUnit),
      thermostat: f.get('thermostat') === 'on' && !!v('targetTemp'),
      losses: losses
        ? {
            weather: hourly ? table!.rows : { airTemp: q('airTemp', T), relativeHumidity: Number(v('rh')) / 100, wind: q('wind', speed.mathUnit), solar: q('solar', 'W/m^2') },
            ...(f.get('cover') === 'on' ? { cover: { coveredHours: hoursBetween(Number(v('coverFrom')), Number(v('coverTo'))) } } : {}),
          }
        : false,
    };
    if (v('price')) body.cost = { fuel: v('fuel'), pricePerUnit: Number(v('price')), ...(v('efficiency') ? { efficiency: Number(v('efficiency')) } : {}) };
    const fitId = v('fitId');
    if (fitId) body.fitId = fitId;
    else body.heater = { model: 'coil', sourceTemp: q('ts', T), UA: q('ua', 'W/K') };
    setBusy(true);
    setError(null);
    try {
      setRes(await api<Result>(`/api/labs/${labId}/forecast`, { body }));
    } catch (err) {
      setError(err instanceof ApiError ? err.message : 'The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }

  const field = (name: string, label: string, def: string, unit: string) => (
    <label className="block">
      <span className="field-label">
        {label} <span className="text-xs text-ink-muted">({unit})</span>
      </span>
      <input name={name} defaultValue={def} inputMode="decimal" className="field-input num" />
    </label>
  );

  const hourSelect = (name: string, label: string, def: number, fullName: string) => (
    <label className="block">
      <span className="field-label">{label}</span>
      <select name={name} defaultValue={def} aria-label={fullName} className="field-input num">
        {HOURS.map((h) => (
          <option key={h} value={h}>
            {hh(h)}
          </option>
        ))}
      </select>
    </label>
  );

  return (
    <div className="grid gap-6 lg:grid-cols-[20rem_1fr]">
      <form onSubmit={submit} method="post" className="space-y-4">
        <fieldset className="card space-y-3 p-4">
          <legend className="px-1 font-semibold">Pool or tub</legend>
          <label className="block">
            <span className="field-label">Shape</span>
            <select className="field-input" value={shape} onChange={(e) => setShape(e.target.value)}>
              <option value="round">Round</option>
              <option value="rectangle">Rectangle</option>
              <option value="ellipse">Oval (ellipse)</option>
              <option value="stadium">Stadium</option>
            </select>
          </label>
          {shape === 'round' ? field('diameter', 'Diameter', us ? '18' : '5.5', length.label) : (
            <div className="grid grid-cols-2 gap-3">
              {field('length', 'Length', us ? '32' : '10', length.label)}
              {field('width', 'Width', us ? '16' : '5', length.label)}
            </div>
          )}
          {field('depth', 'Water depth', us ? '4' : '1.2', length.label)}
        </fieldset>
        <fieldset className="card space-y-3 p-4">
          <legend className="px-1 font-semibold">Heating</legend>
          <div className="grid grid-cols-2 gap-3">
            {field('startTemp', 'Start', us ? '68' : '20', u.temp.label)}
            {field('targetTemp', 'Target', us ? '82' : '28', u.temp.label)}
            {field('hours', 'Hours', '48', 'h')}
            {field('flow', 'Pump flow', us ? '3' : '12', u.flow.label)}
          </div>
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" name="thermostat" defaultChecked /> stop heating at the target (thermostat)
          </label>
          <div className="grid grid-cols-3 gap-3 text-sm">
            {hourSelect('startHour', 'Starts at', 8, 'Forecast starts at')}
            {hourSelect('heaterFrom', 'Heater on', 0, 'Heater on at')}
            {hourSelect('heaterTo', 'off', 0, 'Heater off at')}
          </div>
          <p className="text-xs text-ink-muted">The same on and off hours are all day. The pump runs while the heater does.</p>
          <label className="block">
            <span className="field-label">Heater</span>
            <select name="fitId" aria-label="Heater" className="field-input" defaultValue={fits[0]?.id ?? ''}>
              {fits.map((x) => (
                <option key={x.id} value={x.id}>
                  {x.label}
                </option>
              ))}
              <option value="">Enter Ts and UA</option>
            </select>
          </label>
          <div className="grid grid-cols-2 gap-3">
            {field('ts', 'Source Ts', us ? '194' : '90', u.temp.label)}
            {field('ua', 'UA', '500', 'W/K')}
          </div>
          <p className="text-xs text-ink-muted">Ts and UA are used only when no saved fit is chosen.</p>
        </fieldset>
        <fieldset className="card space-y-3 p-4">
          <legend className="px-1 font-semibold">Weather and cover</legend>
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={losses} onChange={(e) => setLosses(e.target.checked)} /> include losses (evaporation, convection, radiation) and sun
          </label>
          {losses ? (
            <div className="space-y-3">
              <div className="flex gap-4 text-sm" role="radiogroup" aria-label="Weather">
                <label className="flex items-center gap-1.5">
                  <input type="radio" name="weatherMode" checked={weatherMode === 'constant'} onChange={() => setWeatherMode('constant')} /> constant
                </label>
                <label className="flex items-center gap-1.5">
                  <input type="radio" name="weatherMode" checked={weatherMode === 'hourly'} onChange={() => setWeatherMode('hourly')} /> hourly table (CSV)
                </label>
              </div>
              {weatherMode === 'constant' ? (
                <div className="grid grid-cols-2 gap-3">
                  {field('airTemp', 'Air', us ? '72' : '22', u.temp.label)}
                  {field('rh', 'Humidity', '60', '%')}
                  {field('wind', 'Wind', us ? '2' : '1', speed.label)}
                  {field('solar', 'Mean sun', '150', 'W/m²')}
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
                {hourSelect('coverFrom', 'from', 20, 'Cover on from')}
                {hourSelect('coverTo', 'to', 7, 'Cover off at')}
              </div>
            </div>
          ) : null}
        </fieldset>
        <fieldset className="card space-y-3 p-4">
          <legend className="px-1 font-semibold">Running cost (optional)</legend>
          <label className="block">
            <span className="field-label">Fuel</span>
            <select name="fuel" className="field-input" defaultValue="propane">
              <option value="propane">Propane (price per gal)</option>
              <option value="natural-gas">Natural gas (per therm)</option>
              <option value="electric-resistance">Electric resistance (per kWh)</option>
              <option value="heat-pump">Heat pump (per kWh; efficiency = COP)</option>
              <option value="wood">Wood (per cord)</option>
            </select>
          </label>
          <div className="grid grid-cols-2 gap-3">
            {field('price', 'Price', '', 'per unit')}
            {field('efficiency', 'Efficiency', '', '0–1 or COP')}
          </div>
          <p className="text-xs text-ink-muted">Heating values are higher heating values (EIA). The efficiency defaults to the fuel’s typical value.</p>
        </fieldset>
        <button type="submit" className="btn-primary w-full" disabled={busy}>
          {busy ? 'Forecasting…' : 'Forecast'}
        </button>
      </form>
      <div className="min-w-0 space-y-5" aria-live="polite">
        {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">{error}</p> : null}
        {res ? (
          <>
            <dl className="grid gap-3 sm:grid-cols-3">
              {[
                ['Final temperature', <TempValue key="f" tempC={res.finalTemp_degC} units={units} withUnit />],
                ['Hours to target', res.hoursToTarget_h == null ? 'not reached' : `${res.hoursToTarget_h.toFixed(1)} h`],
                ['Equilibrium', res.equilibriumTemp_degC == null ? '—' : <TempValue key="e" tempC={res.equilibriumTemp_degC} units={units} withUnit />],
              ].map(([k, val]) => (
                <div key={String(k)} className="card p-4">
                  <dt className="text-sm text-ink-soft">{k}</dt>
                  <dd className="num mt-1 text-2xl text-ink">{val}</dd>
                </div>
              ))}
            </dl>
            {res.fitNote ? <p className="text-sm text-ink-soft">{res.fitNote}</p> : null}
            {res.pool ? (
              <p className="text-sm text-ink-soft">
                Pool: <span className="num">{poolVolume.from(res.pool.volume_m3).toFixed(us ? 0 : 1)} {poolVolume.label}</span>, surface{' '}
                <span className="num">{area.from(res.pool.area_m2).toFixed(us ? 0 : 1)} {area.label}</span>.
              </p>
            ) : null}
            <CautionList cautions={res.cautions} />
            <PlotFigure {...res.plots.trajectory} filename="forecast" />
            <PlotFigure {...res.plots.budget} filename="energy-budget" />
            {res.cost ? (
              <dl className="grid gap-3 sm:grid-cols-3">
                {[
                  ['Per useful therm', res.cost.perUsefulTherm.toFixed(2)],
                  [`Per degree (${u.tempDiff.label})`, (us ? res.cost.perDegF : res.cost.perK).toFixed(2)],
                  ['Heat of this forecast', res.cost.forecastHeatCost.toFixed(2)],
                ].map(([k, val]) => (
                  <div key={k} className="card p-4">
                    <dt className="text-sm text-ink-soft">{k}</dt>
                    <dd className="num mt-1 text-xl text-ink">{val}</dd>
                  </div>
                ))}
              </dl>
            ) : null}
            {res.riseTable ? (
              <div className="card overflow-x-auto p-4">
                <table className="data-table">
                  <caption className="py-1 text-left text-sm font-semibold text-ink">Rise per hour by pump flow and pool size, at the start temperature</caption>
                  <thead>
                    <tr>
                      <th scope="col">Flow</th>
                      {res.riseTable.volumesM3.map((vol) => (
                        <th key={vol} scope="col" className="text-right">
                          {poolVolume.from(vol).toFixed(us ? 0 : 1)} {poolVolume.label}
                        </th>
                      ))}
                    </tr>
                  </thead>
                  <tbody>
                    {res.riseTable.flowsM3PerS.map((q, i) => (
                      <tr key={q}>
                        <th scope="row" className="num bg-white font-normal">
                          {u.flow.from(q).toFixed(1)} {u.flow.label}
                        </th>
                        {res.riseTable!.risePerHourK[i].map((r, j) => (
                          <td key={j} className="num text-right">
                            {u.tempDiff.from(r).toFixed(2)} {u.tempDiff.label}/h
                          </td>
                        ))}
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            ) : null}
          </>
        ) : (
          <p className="text-ink-muted">Set the pool and the heater, then forecast.</p>
        )}
      </div>
    </div>
  );
}
