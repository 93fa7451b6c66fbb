'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api, ApiError } from '../_components/api';
import { displayUnit } from '../_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

type Pick = { kind: 'rig' | 'fit'; id: string };

/**
 * Pick two to `max` rigs or saved fits (the first picked is the reference, "A"), a title, and
 * optionally the common inlet and flow in the reader's units; saved in SI.
 */
export function NewComparison(props: { labId: string; units: UnitSystem; max: number; rigs: { id: string; name: string; trials: number }[]; fits: { id: string; title: string; rig: string; model: string }[] }) {
  const router = useRouter();
  const [picked, setPicked] = useState<Pick[]>([]);
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const temp = displayUnit('temperature', props.units), flow = displayUnit('volumeFlow', props.units);
  const isOn = (p: Pick) => picked.some((x) => x.kind === p.kind && x.id === p.id);
  const toggle = (p: Pick) => setPicked((all) => (isOn(p) ? all.filter((x) => !(x.kind === p.kind && x.id === p.id)) : all.length >= props.max ? all : [...all, p]));
  const keyOf = (p: Pick) => {
    const i = picked.findIndex((x) => x.kind === p.kind && x.id === p.id);
    return i < 0 ? null : String.fromCharCode(65 + i);
  };
  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const n = (k: string) => {
      const s = String(f.get(k) ?? '').trim().replace(',', '.');
      return s ? Number(s) : undefined;
    };
    const tin = n('inlet'), q = n('flow');
    const body = {
      title: String(f.get('title') ?? ''),
      subjects: picked,
      ...(tin !== undefined ? { inletTempC: temp.to(tin) } : {}),
      ...(q !== undefined ? { flowM3PerS: flow.to(q) } : {}),
    };
    setBusy(true);
    setError(null);
    setFields({});
    try {
      const r = await api<{ comparison: { id: string } }>(`/api/labs/${props.labId}/comparisons`, { body });
      router.push(`/comparisons/${r.comparison.id}`);
    } catch (err) {
      if (err instanceof ApiError) {
        setError(err.message);
        setFields(err.fields);
      } else setError('The server could not be reached.');
      setBusy(false);
    }
  }
  const box = (p: Pick, label: string, hint: string) => (
    <li key={`${p.kind}-${p.id}`}>
      <label className="flex items-start gap-2">
        <input type="checkbox" className="mt-1" checked={isOn(p)} onChange={() => toggle(p)} disabled={!isOn(p) && picked.length >= props.max} />
        <span>
          {keyOf(p) ? <span className="num mr-1 rounded bg-ember-50 px-1 font-semibold text-ember-700">{keyOf(p)}</span> : null}
          {label} <span className="block text-xs text-ink-muted">{hint}</span>
        </span>
      </label>
    </li>
  );
  return (
    <form onSubmit={submit} className="mt-3 space-y-4">
      <label className="block">
        <span className="field-label">Title</span>
        <input name="title" required maxLength={160} className="field-input" placeholder="Longer coil against the first one" />
        {fields.title ? <p className="mt-1 text-sm text-danger-text">{fields.title}</p> : null}
      </label>
      <fieldset>
        <legend className="field-label">Rigs (all included trials, coil model)</legend>
        <ul className="space-y-1 text-sm">{props.rigs.map((r) => box({ kind: 'rig', id: r.id }, r.name, `${r.trials} included trials`))}</ul>
      </fieldset>
      {props.fits.length ? (
        <fieldset>
          <legend className="field-label">Saved fits (their own trials and model)</legend>
          <ul className="max-h-60 space-y-1 overflow-y-auto text-sm">{props.fits.map((f) => box({ kind: 'fit', id: f.id }, f.title, `${f.rig} · ${f.model}`))}</ul>
        </fieldset>
      ) : null}
      <p className="text-sm text-ink-soft">
        Pick 2 to {props.max}; the first you pick is the reference (A). {picked.length} picked.
      </p>
      {fields.subjects ? <p className="text-sm text-danger-text">{fields.subjects}</p> : null}
      <div className="grid gap-3 sm:grid-cols-2">
        <label className="block">
          <span className="field-label">Common inlet ({temp.label})</span>
          <input name="inlet" inputMode="decimal" className="field-input" placeholder="mean of the trials" />
          {fields.inletTempC ? <p className="mt-1 text-sm text-danger-text">{fields.inletTempC}</p> : null}
        </label>
        <label className="block">
          <span className="field-label">Common flow ({flow.label})</span>
          <input name="flow" inputMode="decimal" className="field-input" placeholder="middle of the tested flows" />
          {fields.flowM3PerS ? <p className="mt-1 text-sm text-danger-text">{fields.flowM3PerS}</p> : null}
        </label>
      </div>
      {error ? (
        <p role="alert" className="text-sm text-danger-text">
          {error}
        </p>
      ) : null}
      <button type="submit" className="btn-primary" disabled={busy || picked.length < 2}>
        {busy ? 'Comparing…' : 'Compare and save'}
      </button>
    </form>
  );
}
