'use client';

/** Settings of the forecast, cost-sheet and sensor-log blocks in the study editor. */
import type { UnitSystem } from '@/analysis/units/unit-system';
import { defaultPoolVolume } from './study-blocks-model';
import { SeasonSettings } from './season-settings';

type Data = Record<string, unknown>;

const FUELS = [
  { fuel: 'propane', label: 'Propane', unit: 'gal', eff: '0.82' },
  { fuel: 'natural-gas', label: 'Natural gas', unit: 'therm', eff: '0.82' },
  { fuel: 'electric-resistance', label: 'Electric resistance', unit: 'kWh', eff: '1' },
  { fuel: 'heat-pump', label: 'Heat pump', unit: 'kWh', eff: '5 (COP)' },
  { fuel: 'wood', label: 'Wood', unit: 'cord', eff: '0.30' },
] as const;

const num = (v: string): number | null => (v.trim() === '' || !Number.isFinite(Number(v)) ? null : Number(v));

export function CostSettings({ n, data, set, units, forecasts }: { n: number; data: Data; set: (d: Data) => void; units: UnitSystem; forecasts: { id: string; n: number }[] }) {
  const fuel = FUELS.find((f) => f.fuel === data.fuel) ?? FUELS[0];
  const from = String(data.heatFrom ?? 'pool');
  const text = (k: string, label: string, hint: string) => (
    <label className="text-sm">
      <span className="field-label">{label}</span>
      <input aria-label={`${label} of block ${n}`} className="field-input num" placeholder={hint} value={String(data[k] ?? '')} onChange={(e) => set({ [k]: e.target.value })} />
    </label>
  );
  const number = (k: string, label: string, name: string, hint: string) => (
    <label className="text-sm">
      <span className="field-label">{label}</span>
      <input
        aria-label={`${name} of block ${n}`}
        className="field-input num"
        type="number"
        min={0}
        step="any"
        placeholder={hint}
        value={data[k] == null ? '' : String(data[k])}
        onChange={(e) => set({ [k]: num(e.target.value) })}
      />
    </label>
  );
  return (
    <div className="grid gap-2 sm:grid-cols-3">
      <label className="text-sm">
        <span className="field-label">Fuel or energy</span>
        <select aria-label={`Fuel of block ${n}`} className="field-input" value={fuel.fuel} onChange={(e) => set({ fuel: e.target.value })}>
          {FUELS.map((f) => (
            <option key={f.fuel} value={f.fuel}>
              {f.label} (per {f.unit})
            </option>
          ))}
        </select>
      </label>
      {number('price', `Price per ${fuel.unit}`, 'Price', '')}
      <label className="text-sm">
        <span className="field-label">Currency</span>
        <input aria-label={`Currency of block ${n}`} className="field-input" maxLength={8} value={String(data.currency ?? '')} onChange={(e) => set({ currency: e.target.value })} />
      </label>
      {number('efficiency', fuel.fuel === 'heat-pump' ? 'COP' : 'Efficiency (0–1)', 'Efficiency', `default ${fuel.eff}`)}
      <label className="text-sm">
        <span className="field-label">Heat needed</span>
        <select aria-label={`Heat needed of block ${n}`} className="field-input" value={from} onChange={(e) => set({ heatFrom: e.target.value, ...(e.target.value === 'forecast' && !data.forecastBlockId && forecasts[0] ? { forecastBlockId: forecasts[0].id } : {}) })}>
          <option value="forecast" disabled={!forecasts.length}>
            From a forecast block
          </option>
          <option value="pool">Pool volume and rise</option>
          <option value="energy">Useful heat (e.g. a season’s)</option>
        </select>
      </label>
      {from === 'forecast' ? (
        <label className="text-sm">
          <span className="field-label">Forecast block</span>
          <select aria-label={`Forecast of block ${n}`} className="field-input" value={String(data.forecastBlockId ?? '')} onChange={(e) => set({ forecastBlockId: e.target.value })}>
            <option value="">Choose…</option>
            {forecasts.map((f) => (
              <option key={f.id} value={f.id}>
                Block {f.n}: forecast
              </option>
            ))}
          </select>
        </label>
      ) : from === 'pool' ? (
        <>
          {text('poolVolume', 'Pool volume', defaultPoolVolume(units))}
          {text('rise', 'Rise', units === 'us' ? '10 degF' : '5 K')}
        </>
      ) : (
        text('heat', 'Useful heat', units === 'us' ? '100 therm' : '3000 kWh')
      )}
      <SeasonSettings n={n} data={data} set={set} units={units} />
      <p className="text-xs text-ink-muted sm:col-span-3">Quantities take units (gal, m^3, degF, K, therm, kWh). Heat contents are EIA higher heating values; efficiency defaults to the fuel’s typical value.</p>
    </div>
  );
}

export function SensorLogSettings({ n, data, set, logs }: { n: number; data: Data; set: (d: Data) => void; logs: { id: string; label: string }[] }) {
  if (!logs.length) return <p className="text-sm text-ink-muted">No sensor log has been imported in this lab yet: import one from a rig’s page.</p>;
  return (
    <select aria-label={`Sensor log of block ${n}`} className="field-input" value={String(data.sourceFileId ?? '')} onChange={(e) => set({ sourceFileId: e.target.value || undefined })}>
      <option value="">Choose an imported sensor log…</option>
      {logs.map((l) => (
        <option key={l.id} value={l.id}>
          {l.label}
        </option>
      ))}
    </select>
  );
}

const FORECAST_FIELDS = { poolVolume: 'Pool volume', startTemp: 'Start', targetTemp: 'Target', flow: 'Pump flow' } as const;

/** A forecast block: pool volume, start and target, pump flow and hours (each typed with its unit), and the heater. */
export function ForecastSettings({ data, set, fits }: { data: Data; set: (d: Data) => void; fits: { id: string; label: string; coil: boolean }[] }) {
  return (
    <div className="grid gap-2 sm:grid-cols-3">
      {(['poolVolume', 'startTemp', 'targetTemp', 'flow'] as const).map((k) => (
        <label key={k} className="text-sm">
          <span className="field-label">{FORECAST_FIELDS[k]}</span>
          <input className="field-input num" value={String(data[k] ?? '')} onChange={(e) => set({ [k]: e.target.value })} />
        </label>
      ))}
      <label className="text-sm">
        <span className="field-label">Hours</span>
        <input className="field-input num" value={String(data.hours ?? '')} onChange={(e) => set({ hours: Number(e.target.value) || 0 })} />
      </label>
      <label className="text-sm">
        <span className="field-label">Heater (coil fit)</span>
        <select className="field-input" value={String(data.fitId ?? '')} onChange={(e) => set({ fitId: e.target.value || undefined })}>
          {fits.filter((f) => f.coil).map((f) => (
            <option key={f.id} value={f.id}>
              {f.label}
            </option>
          ))}
          <option value="">Ts and UA given in the block</option>
        </select>
      </label>
    </div>
  );
}
