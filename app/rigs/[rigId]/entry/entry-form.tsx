'use client';

import { useRef, useState } from 'react';
import { api, ApiError } from '../../../_components/api';
import { FillTimer } from '../../../_components/fill-timer';
import { TempValue, TemperatureCautions } from '../../../_components/safety-notice';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

interface Previous {
  bucketVolumeM3: number | null;
  inletTempC: number;
  ambientTempC: number | null;
}


/**
 * Entry at the rig, sized for a phone: a fill timer (start when the bucket goes under the
 * stream, stop when it is full), the bucket volume, the temperatures, and the previous trial's
 * values offered.
 */
export function EntryForm({ rigId, units, previous }: { rigId: string; units: UnitSystem; previous: Previous | null }) {
  const u = displayUnits(units);
  const t = { vol: u.volume.mathUnit, temp: u.temp.mathUnit, flow: u.flow.mathUnit };
  const [fills, setFills] = useState<number[]>([]);
  const [message, setMessage] = useState<string | null>(null);
  const [saved, setSaved] = useState<{ inletTempC: number; outletTempC: number } | null>(null);
  const [warnings, setWarnings] = useState<string[]>([]);
  const [error, setError] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const formRef = useRef<HTMLFormElement>(null);

  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const num = (k: string) => String(f.get(k) ?? '').trim().replace(',', '.');
    const body: Record<string, unknown> = {
      inlet: num('inlet') && `${num('inlet')} ${t.temp}`,
      outlet: num('outlet') && `${num('outlet')} ${t.temp}`,
      notes: String(f.get('notes') ?? ''),
      isReference: f.get('isReference') === 'on',
    };
    if (num('ambient')) body.ambient = `${num('ambient')} ${t.temp}`;
    if (num('flow')) body.flow = `${num('flow')} ${t.flow}`;
    else {
      if (num('bucket')) body.bucketVolume = `${num('bucket')} ${t.vol}`;
      if (fills.length) body.fillTimesS = fills;
    }
    setBusy(true);
    setError(null);
    setFieldErrors({});
    setMessage(null);
    setSaved(null);
    setWarnings([]);
    try {
      const r = await api<{ trials: { flowM3PerS: number; outletTempC: number; inletTempC: number }[]; warnings: { messages: string[] }[] }>(`/api/rigs/${rigId}/trials`, { body });
      const saved = r.trials[0];
      setMessage(`Saved: ${u.flow.from(saved.flowM3PerS).toFixed(2)} ${u.flow.label}, rise ${(u.temp.from(saved.outletTempC) - u.temp.from(saved.inletTempC)).toFixed(1)} ${u.tempDiff.label}.`);
      setSaved({ inletTempC: saved.inletTempC, outletTempC: saved.outletTempC });
      setWarnings(r.warnings.flatMap((w) => w.messages));
      setFills([]);
      const outlet = formRef.current?.elements.namedItem('outlet') as HTMLInputElement | null;
      if (outlet) outlet.value = '';
    } catch (err) {
      if (err instanceof ApiError) {
        setError(err.message);
        setFieldErrors(err.fields);
      } else setError('The server could not be reached: nothing was saved. Try again when you have signal.');
    } finally {
      setBusy(false);
    }
  }

  const fe = (k: string) => (fieldErrors[k] ? <p className="mt-1 text-sm text-danger-text">{fieldErrors[k]}</p> : null);

  return (
    <form ref={formRef} onSubmit={submit} className="space-y-5" method="post">
      <fieldset className="card space-y-4 p-4">
        <legend className="px-1 text-lg font-semibold">Flow</legend>
        <label className="block">
          <span className="field-label">Bucket volume ({u.volume.label})</span>
          <input name="bucket" inputMode="decimal" className="field-input num text-lg" defaultValue={previous?.bucketVolumeM3 ? +u.volume.from(previous.bucketVolumeM3).toFixed(2) : ''} />
          {fe('bucketVolume')}
        </label>
        <div>
          <FillTimer fills={fills} onChange={setFills} />
          {fe('fillTimesS')}
        </div>
        <label className="block">
          <span className="field-label">…or a flow reading ({u.flow.label})</span>
          <input name="flow" inputMode="decimal" className="field-input num" />
          {fe('flow')}
        </label>
      </fieldset>
      <fieldset className="card grid grid-cols-2 gap-4 p-4">
        <legend className="px-1 text-lg font-semibold">Temperatures ({u.temp.label})</legend>
        <label>
          <span className="field-label">Inlet</span>
          <input name="inlet" inputMode="decimal" required className="field-input num text-lg" defaultValue={previous ? +u.temp.from(previous.inletTempC).toFixed(1) : ''} />
          {fe('inlet')}
        </label>
        <label>
          <span className="field-label">Outlet</span>
          <input name="outlet" inputMode="decimal" required className="field-input num text-lg" />
          {fe('outlet')}
        </label>
        <label>
          <span className="field-label">Ambient</span>
          <input name="ambient" inputMode="decimal" className="field-input num" defaultValue={previous?.ambientTempC != null ? +u.temp.from(previous.ambientTempC).toFixed(1) : ''} />
        </label>
        <label className="flex items-end gap-2 pb-2 text-sm">
          <input type="checkbox" name="isReference" /> reference flow
        </label>
        <label className="col-span-2">
          <span className="field-label">Notes</span>
          <input name="notes" className="field-input" placeholder="fuel added, wind, sun…" />
        </label>
      </fieldset>
      {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-sm text-danger-text">{error}</p> : null}
      {message ? (
        <p role="status" className="rounded-lg bg-ok-bg px-3 py-2 text-sm text-ok-text">
          {message}
          {saved ? <> Outlet <span className="num"><TempValue tempC={saved.outletTempC} units={units} withUnit /></span>.</> : null}
        </p>
      ) : null}
      {saved ? <TemperatureCautions units={units} label="Cautions for this trial" places={[{ where: 'outlet', valuesC: [saved.outletTempC] }, { where: 'inlet', valuesC: [saved.inletTempC] }]} /> : null}
      {warnings.map((w) => (
        <p key={w} className="rounded-lg border border-caution-line bg-caution-bg px-3 py-2 text-sm text-caution-text">{w}</p>
      ))}
      <button type="submit" className="btn-primary w-full py-3 text-base" disabled={busy}>
        {busy ? 'Saving…' : 'Save trial'}
      </button>
    </form>
  );
}
