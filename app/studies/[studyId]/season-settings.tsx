'use client';

/** The season of a cost-sheet block in the study editor: length and use, its weather, the build's cost and the heater one could buy. */
import type { UnitSystem } from '@/analysis/units/unit-system';

type Data = Record<string, unknown>;
const num = (v: string): number | null => (v.trim() === '' || !Number.isFinite(Number(v)) ? null : Number(v));

/** A new season: 120 days at 28 °C (82 °F), the heater 8 h a day, the cover on otherwise, a summer's mean day. Prices are the user's. */
export function seasonDefaults(units: UnitSystem): Data {
  const us = units === 'us';
  return {
    days: 120, hoursPerDay: 8, targetTemp: us ? '82 degF' : '28 degC', cover: true,
    weather: { airTemp: us ? '75 degF' : '24 degC', relativeHumidity: 0.6, wind: us ? '4.5 mph' : '2 m/s', solar: '150 W/m^2' },
    surfaceArea: us ? '350 ft^2' : '32 m^2',
    buildPrice: null,
  };
}

const FUELS = [
  ['propane', 'Propane (per gal)'], ['natural-gas', 'Natural gas (per therm)'], ['electric-resistance', 'Electric resistance (per kWh)'],
  ['heat-pump', 'Heat pump (per kWh)'], ['wood', 'Wood (per cord)'],
] as const;

export function SeasonSettings({ n, data, set, units }: { n: number; data: Data; set: (d: Data) => void; units: UnitSystem }) {
  const s = (data.season ?? null) as Data | null;
  if (!s) {
    return (
      <div className="sm:col-span-3">
        <button type="button" className="btn-quiet" onClick={() => set({ season: seasonDefaults(units) })}>
          Add a season (energy, money and payback)
        </button>
      </div>
    );
  }
  const w = (s.weather ?? {}) as Data;
  const p = (s.purchased ?? null) as Data | null;
  const put = (patch: Data) => set({ season: { ...s, ...patch } });
  const field = (label: string, value: unknown, onChange: (v: string) => void, opts: { type?: string; hint?: string } = {}) => (
    <label className="text-sm">
      <span className="field-label">{label}</span>
      <input aria-label={`${label} of block ${n}`} className="field-input num" type={opts.type ?? 'text'} step="any" placeholder={opts.hint} value={value == null ? '' : String(value)} onChange={(e) => onChange(e.target.value)} />
    </label>
  );
  return (
    <fieldset className="grid gap-2 rounded-lg border border-paper-line p-3 sm:col-span-3 sm:grid-cols-3">
      <legend className="px-1 text-sm font-semibold">Season</legend>
      {field('Season days', s.days, (v) => put({ days: num(v) }), { type: 'number' })}
      {field('Heater hours a day', s.hoursPerDay, (v) => put({ hoursPerDay: num(v) }), { type: 'number' })}
      {field('Season target', s.targetTemp, (v) => put({ targetTemp: v }), { hint: units === 'us' ? '82 degF' : '28 degC' })}
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" aria-label={`Season cover of block ${n}`} checked={s.cover === true} onChange={(e) => put({ cover: e.target.checked })} />
        Cover on outside the heater hours
      </label>
      {field('Mean air', w.airTemp, (v) => put({ weather: { ...w, airTemp: v } }))}
      {field('Mean humidity (0–1)', w.relativeHumidity, (v) => put({ weather: { ...w, relativeHumidity: num(v) } }), { type: 'number' })}
      {field('Mean wind', w.wind, (v) => put({ weather: { ...w, wind: v } }))}
      {field('Mean sun', w.solar, (v) => put({ weather: { ...w, solar: v } }))}
      {field('Water surface', s.surfaceArea, (v) => put({ surfaceArea: v }))}
      {field('Build price', s.buildPrice, (v) => put({ buildPrice: num(v) }), { type: 'number' })}
      {p ? (
        <>
          {field('Purchased heater price', p.price, (v) => put({ purchased: { ...p, price: num(v) } }), { type: 'number' })}
          <label className="text-sm">
            <span className="field-label">Purchased heater fuel</span>
            <select aria-label={`Purchased heater fuel of block ${n}`} className="field-input" value={String(p.fuel ?? data.fuel ?? 'propane')} onChange={(e) => put({ purchased: { ...p, fuel: e.target.value } })}>
              {FUELS.map(([k, label]) => <option key={k} value={k}>{label}</option>)}
            </select>
          </label>
          {field('Its fuel price', p.fuelPrice, (v) => put({ purchased: { ...p, fuelPrice: num(v) } }), { type: 'number', hint: 'same fuel: the sheet’s' })}
          {field('Its efficiency or COP', p.efficiency, (v) => put({ purchased: { ...p, efficiency: num(v) } }), { type: 'number', hint: 'typical for the fuel' })}
          <div className="text-sm sm:self-end">
            <button type="button" className="btn-quiet" onClick={() => put({ purchased: undefined })}>No purchased heater</button>
          </div>
        </>
      ) : (
        <div className="text-sm sm:self-end">
          <button type="button" className="btn-quiet" onClick={() => put({ purchased: { price: null, fuel: String(data.fuel ?? 'propane') } })}>Compare with a purchased heater</button>
        </div>
      )}
      <div className="text-sm sm:self-end">
        <button type="button" className="btn-quiet" onClick={() => set({ season: undefined })}>Remove the season</button>
      </div>
      <p className="text-xs text-ink-muted sm:col-span-3">
        The season reads the pool and heater of the sheet’s forecast block; its weather is the season’s mean day (the forecast’s losses with it). A pool kept above 40 °C (104 °F) is a scald and overheating risk.
      </p>
    </fieldset>
  );
}
