'use client';

import { useState } from 'react';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnit, displayUnits } from '@/app/_contracts/units';
import type { TubFillView } from '../_contracts/study-blocks';
import { api, ApiError } from '../_components/api';
import { TubFillResultView } from '../_components/tub-fill-result';
import { NumberField } from './forecast-fields';

/** Filling a tub in one pass through the heater: fill time, final temperature, and the flow for a target. */
export function TubFill({ labId, units, fits }: { labId: string; units: UnitSystem; fits: { id: string; label: string; collector?: boolean }[] }) {
  const u = displayUnits(units);
  const vol = displayUnit('volume', units);
  const us = units === 'us';
  const [res, setRes] = useState<TubFillView | null>(null);
  const [error, setError] = useState<string | null>(null);
  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const v = (k: string) => String(f.get(k) ?? '').trim().replace(',', '.');
    const q = (k: string, unit: string) => (v(k) ? `${v(k)} ${unit}` : undefined);
    const fitId = v('tubFitId');
    const body = {
      ...(fitId ? { fitId } : { heater: { sourceTemp: q('tubTs', u.temp.mathUnit), UA: q('tubUa', 'W/K') } }),
      tubVolume: q('tubVolume', vol.mathUnit), flow: q('tubFlow', u.flow.mathUnit), supplyTemp: q('tubSupply', u.temp.mathUnit),
      ...(v('tubTarget') ? { targetTemp: q('tubTarget', u.temp.mathUnit) } : {}),
    };
    setError(null);
    try {
      setRes(await api<TubFillView>(`/api/labs/${labId}/tub-fill`, { body }));
    } catch (err) {
      setRes(null);
      setError(err instanceof ApiError ? `${err.message}${Object.keys(err.fields).length ? ` (${Object.entries(err.fields).map(([k, m]) => `${k}: ${m}`).join('; ')})` : ''}` : 'The server could not be reached.');
    }
  }
  return (
    <section className="card mt-8 space-y-4 p-4" aria-label="Filling a tub in one pass">
      <h2 className="text-lg">Filling a tub in one pass</h2>
      <p className="text-sm text-ink-soft">The tub fills through the heater from the supply, with no recirculation. A tub above 40 °C (104 °F) is dangerous: check it before anyone gets in.</p>
      <form onSubmit={submit} className="grid gap-3 sm:grid-cols-3">
        <NumberField name="tubVolume" label="Tub volume" def={us ? '300' : '1200'} unit={vol.label} />
        <NumberField name="tubFlow" label="Fill flow" def={us ? '1.5' : '6'} unit={u.flow.label} />
        <NumberField name="tubSupply" label="Supply" def={us ? '60' : '15'} unit={u.temp.label} />
        <NumberField name="tubTarget" label="Target (optional)" def={us ? '100' : '38'} unit={u.temp.label} />
        <label className="block sm:col-span-2">
          <span className="field-label">Heater</span>
          <select name="tubFitId" className="field-input" defaultValue={fits.find((x) => !x.collector)?.id ?? ''}>
            {fits.filter((x) => !x.collector).map((x) => <option key={x.id} value={x.id}>{x.label}</option>)}
            <option value="">Enter Ts and UA</option>
          </select>
        </label>
        <NumberField name="tubTs" label="Source Ts" def={us ? '190' : '88'} unit={u.temp.label} />
        <NumberField name="tubUa" label="UA" def="430" unit="W/K" />
        <button type="submit" className="btn-primary self-end">Fill</button>
      </form>
      {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-sm text-danger-text">{error}</p> : null}
      {res ? (
        <div aria-live="polite">
          <TubFillResultView fill={res} units={units} />
        </div>
      ) : null}
    </section>
  );
}
