'use client';

import { useState } from 'react';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnit, displayUnits } from '@/app/_contracts/units';
import type { CautionLike } from '@/analysis/safety/cautions';
import { api, ApiError } from '../_components/api';
import { CautionList, TempValue } from '../_components/safety-notice';
import { NumberField } from './forecast-fields';

interface TubFillResult {
  fillTimeS: number;
  outletTempC: number;
  finalTempC: number;
  heaterNote: string;
  target: { targetTempC: number; outletTempC: number; flowM3PerS: number | null; fillTimeS: number | null; note: string } | null;
  cautions: CautionLike[];
}

const hm = (s: number) => `${Math.floor(s / 3600)} h ${String(Math.round((s % 3600) / 60)).padStart(2, '0')} min`;

/** Filling a tub in one pass through the heater: fill time, final temperature, and the flow for a target. */
export function TubFill({ labId, units, fits }: { labId: string; units: UnitSystem; fits: { id: string; label: string; collector?: boolean }[] }) {
  const u = displayUnits(units);
  const vol = displayUnit('volume', units);
  const us = units === 'us';
  const [res, setRes] = useState<TubFillResult | null>(null);
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
      setRes(await api<TubFillResult>(`/api/labs/${labId}/tub-fill`, { body }));
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
        <div className="space-y-3" aria-live="polite">
          <dl className="grid gap-3 sm:grid-cols-3">
            <div><dt className="text-sm text-ink-soft">Fill time</dt><dd className="num text-xl">{hm(res.fillTimeS)}</dd></div>
            <div><dt className="text-sm text-ink-soft">Heater outlet</dt><dd className="num text-xl"><TempValue tempC={res.outletTempC} units={units} withUnit /></dd></div>
            <div><dt className="text-sm text-ink-soft">Tub when full</dt><dd className="num text-xl"><TempValue tempC={res.finalTempC} units={units} withUnit /></dd></div>
          </dl>
          {res.target ? (
            <p className="text-sm">
              For <TempValue tempC={res.target.targetTempC} units={units} withUnit />:{' '}
              {res.target.flowM3PerS ? <><span className="num">{u.flow.from(res.target.flowM3PerS).toFixed(2)} {u.flow.label}</span>, filling in <span className="num">{hm(res.target.fillTimeS!)}</span>. </> : null}
              {res.target.note}
            </p>
          ) : null}
          <p className="text-xs text-ink-muted">{res.heaterNote} Surface losses during the fill are left out (fills take minutes to hours).</p>
          <CautionList cautions={res.cautions} />
        </div>
      ) : null}
    </section>
  );
}
