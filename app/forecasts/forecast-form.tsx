'use client';

import { useState } from 'react';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { api, ApiError } from '../_components/api';
import { CostFieldset } from './cost-fieldset';
import { forecastBody, type ForecastChoices } from './forecast-request';
import { ForecastResultView, type ForecastResult } from './forecast-result';
import { HeatingFieldset } from './heating-fieldset';
import { MeasuredFieldset } from './measured-fieldset';
import { PoolFieldset } from './pool-fieldset';
import { WeatherFieldset } from './weather-fieldset';
import { parseWeatherCsv } from './weather-csv';

/** Pool or tub warm-up forecast: shape and size, temperatures, flow, heater (a saved coil fit or Ts/UA), weather and cover. */
export function ForecastForm({ labId, units, fits }: { labId: string; units: UnitSystem; fits: { id: string; label: string; collector?: boolean }[] }) {
  const [res, setRes] = useState<ForecastResult | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [choices, setChoices] = useState<ForecastChoices>({ shape: 'round', losses: true, weatherMode: 'constant', table: null, collectorFits: fits.filter((f) => f.collector).map((f) => f.id) });
  const set = (patch: Partial<ForecastChoices>) => setChoices((c) => ({ ...c, ...patch }));

  async function readWeather(file: File | undefined) {
    if (!file) return;
    if (file.size > 2 * 1024 * 1024) {
      set({ table: { name: file.name, rows: [], columns: [], issues: [{ line: 1, message: `the file is ${(file.size / 1024 / 1024).toFixed(1)} MB; an hourly table for a year is under 1 MB` }] } });
      return;
    }
    set({ table: { name: file.name, ...parseWeatherCsv(await file.text(), units) } });
  }

  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const r = forecastBody(new FormData(e.currentTarget), choices, units);
    if ('problem' in r) {
      setError(r.problem);
      return;
    }
    setBusy(true);
    setError(null);
    try {
      setRes(await api<ForecastResult>(`/api/labs/${labId}/forecast`, { body: r.body }));
    } catch (err) {
      setError(err instanceof ApiError ? err.message : 'The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="grid gap-6 lg:grid-cols-[20rem_1fr]">
      <form onSubmit={submit} method="post" className="space-y-4">
        <PoolFieldset units={units} shape={choices.shape} onShape={(shape) => set({ shape })} />
        <HeatingFieldset units={units} fits={fits} />
        <WeatherFieldset units={units} choices={choices} set={set} readWeather={(f) => void readWeather(f)} />
        <MeasuredFieldset units={units} />
        <CostFieldset targetHint={units === 'us' ? '°F' : '°C'} />
        <button type="submit" className="btn-primary w-full" disabled={busy}>
          {busy ? 'Forecasting…' : 'Forecast'}
        </button>
      </form>
      <div className="min-w-0 space-y-5" aria-live="polite">
        {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">{error}</p> : null}
        {res ? <ForecastResultView res={res} units={units} /> : <p className="text-ink-muted">Set the pool and the heater, then forecast.</p>}
      </div>
    </div>
  );
}
