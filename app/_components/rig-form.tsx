'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { HEAT_SOURCE_LABELS } from '../_lib/rigs/labels';
import type { RigDetailsDto } from '../_contracts/dto';
import { api, ApiError } from './api';


interface RigValues {
  id?: string;
  name: string;
  heatSource: string;
  description: string;
  notes: string;
  details: RigDetailsDto;
}

/** L/(min·m²) in m³/(s·m²) */
const LPM_PER_M2 = 1e-3 / 60;

/** Create or edit a rig. Coil details are entered in m and mm and stored in SI. */
export function RigForm({ labId, rig }: { labId: string; rig?: RigValues }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const [source, setSource] = useState(rig?.heatSource ?? 'wood-fire');
  const d = rig?.details ?? {};
  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const n = (k: string, scale = 1) => {
      const s = String(f.get(k) ?? '').trim().replace(',', '.');
      return s ? Number(s) * scale : undefined;
    };
    const details = Object.fromEntries(
      Object.entries({
        coilLengthM: n('coilLengthM'),
        tubeInnerDiameterM: n('tubeInnerDiameterMm', 0.001),
        tubeMaterial: String(f.get('tubeMaterial') ?? '').trim() || undefined,
        collectorAreaM2: d.collectorAreaM2,
        burnerRatingW: n('burnerRatingKw', 1000),
        grossAreaM2: n('grossAreaM2'),
        apertureAreaM2: n('apertureAreaM2'),
        tiltDeg: n('tiltDeg'),
        azimuthDeg: n('azimuthDeg'),
        fluid: String(f.get('fluid') ?? '').trim() || undefined,
        fluidCpJPerKgK: n('fluidCpJPerKgK'),
        fluidDensityKgPerM3: n('fluidDensityKgPerM3'),
        flowPerAreaM3PerSM2: n('flowPerAreaLpmM2', LPM_PER_M2),
        buildCost: n('buildCost'),
        buildCostCurrency: String(f.get('buildCostCurrency') ?? '').trim().toUpperCase() || undefined,
      }).filter(([, v]) => v !== undefined),
    );
    const body = { name: f.get('name'), heatSource: f.get('heatSource'), description: f.get('description'), notes: f.get('notes'), details };
    setBusy(true);
    setError(null);
    setFields({});
    try {
      const r = await api<{ rig: { id: string } }>(rig?.id ? `/api/rigs/${rig.id}` : `/api/labs/${labId}/rigs`, { method: rig?.id ? 'PATCH' : 'POST', body });
      router.push(`/rigs/${r.rig.id}`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError) {
        setError(err.message);
        setFields(err.fields);
      } else setError('The server could not be reached.');
      setBusy(false);
    }
  }
  const fe = (k: string) => (fields[k] ? <p className="mt-1 text-sm text-danger-text">{fields[k]}</p> : null);
  return (
    <form onSubmit={submit} method="post" className="space-y-4">
      <label className="block">
        <span className="field-label">Name</span>
        <input name="name" required className="field-input" defaultValue={rig?.name} />
        {fe('name')}
      </label>
      <label className="block">
        <span className="field-label">Heat source</span>
        <select name="heatSource" className="field-input" value={source} onChange={(e) => setSource(e.target.value)}>
          {Object.entries(HEAT_SOURCE_LABELS).map(([v, l]) => (
            <option key={v} value={v}>
              {l}
            </option>
          ))}
        </select>
      </label>
      <label className="block">
        <span className="field-label">Description</span>
        <textarea name="description" rows={3} className="field-input" defaultValue={rig?.description} />
      </label>
      <fieldset className="grid gap-4 sm:grid-cols-2">
        <legend className="field-label mb-1">Coil or collector (optional)</legend>
        <label>
          <span className="text-xs text-ink-muted">Coil length (m)</span>
          <input name="coilLengthM" inputMode="decimal" className="field-input num" defaultValue={d.coilLengthM} />
          {fe('details.coilLengthM')}
        </label>
        <label>
          <span className="text-xs text-ink-muted">Tube bore (mm)</span>
          <input name="tubeInnerDiameterMm" inputMode="decimal" className="field-input num" defaultValue={d.tubeInnerDiameterM ? +(d.tubeInnerDiameterM * 1000).toFixed(2) : ''} />
          {fe('details.tubeInnerDiameterM')}
        </label>
        <label>
          <span className="text-xs text-ink-muted">Tube material</span>
          <input name="tubeMaterial" className="field-input" defaultValue={d.tubeMaterial} />
        </label>
        <label>
          <span className="text-xs text-ink-muted">Burner rating (kW)</span>
          <input name="burnerRatingKw" inputMode="decimal" className="field-input num" defaultValue={d.burnerRatingW ? d.burnerRatingW / 1000 : ''} />
        </label>
        <label>
          <span className="text-xs text-ink-muted">Build cost (for heat per unit of cost)</span>
          <input name="buildCost" inputMode="decimal" className="field-input num" defaultValue={d.buildCost} />
          {fe('details.buildCost')}
        </label>
        <label>
          <span className="text-xs text-ink-muted">Currency of the build cost</span>
          <input name="buildCostCurrency" maxLength={3} className="field-input" placeholder="USD" defaultValue={d.buildCostCurrency} />
          {fe('details.buildCostCurrency')}
        </label>
      </fieldset>
      {source === 'solar-collector' ? (
        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="field-label mb-1">Solar collector</legend>
          <p className="text-xs text-ink-muted sm:col-span-2">The efficiency curve is stated per gross or aperture area: give the one your test refers to (or both).</p>
          {[
            ['grossAreaM2', 'Gross area (m²)', d.grossAreaM2 ?? d.collectorAreaM2],
            ['apertureAreaM2', 'Aperture area (m²)', d.apertureAreaM2],
            ['tiltDeg', 'Tilt from horizontal (°)', d.tiltDeg],
            ['azimuthDeg', 'Azimuth, clockwise from north (°)', d.azimuthDeg],
            ['flowPerAreaLpmM2', 'Flow per gross area (L/(min·m²))', d.flowPerAreaM3PerSM2 === undefined ? undefined : +(d.flowPerAreaM3PerSM2 / LPM_PER_M2).toPrecision(6)],
            ['fluidCpJPerKgK', 'Fluid cp (J/(kg·K)), blank for water', d.fluidCpJPerKgK],
            ['fluidDensityKgPerM3', 'Fluid density (kg/m³), blank for water', d.fluidDensityKgPerM3],
          ].map(([name, label, value]) => (
            <label key={name as string}>
              <span className="text-xs text-ink-muted">{label}</span>
              <input name={name as string} inputMode="decimal" className="field-input num" defaultValue={value as number | undefined} />
              {fe(`details.${name === 'flowPerAreaLpmM2' ? 'flowPerAreaM3PerSM2' : name}`)}
            </label>
          ))}
          <label>
            <span className="text-xs text-ink-muted">Fluid</span>
            <input name="fluid" className="field-input" placeholder="water" defaultValue={d.fluid} />
            {fe('details.fluid')}
          </label>
        </fieldset>
      ) : null}
      <label className="block">
        <span className="field-label">Notes</span>
        <textarea name="notes" rows={3} className="field-input" defaultValue={rig?.notes} />
      </label>
      {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-sm text-danger-text">{error}</p> : null}
      <button type="submit" className="btn-primary" disabled={busy}>
        {rig?.id ? 'Save rig' : 'Create rig'}
      </button>
    </form>
  );
}
