'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api, failureOf } from '../../_components/api';
import { CautionList } from '../../_components/safety-notice';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

interface PlannedRun { key: string; order: number; flowM3PerS: number; predictedOutletTempC: number; piLowC: number; piHighC: number; purpose: string }
interface PlanView {
  dEfficiency: number;
  expectedStdErr: Record<string, number>;
  evenlySpaced: { dEfficiency: number; expectedStdErr: Record<string, number> };
  notes: string[];
  cautions: { code: string; level: 'danger' | 'warning' | 'info'; message: string; where?: string; thresholdC?: number }[];
  feasibleRangeM3PerS: [number, number];
}
export interface SessionListItem { id: string; title: string; state: string; runs: number; done: number; createdAt: string }
export interface PriorFit { id: string; title: string; version: number; model: string }

const PARAM_UNIT: Record<string, string> = { Ts: 'K', Tinf: 'K', UA: 'W/K', A: 'K', k: 's/m³' };

/**
 * The rig page's test sessions: the sessions so far, and the plan form — a prior (a saved fit of the
 * lab or a guess of Ts and UA), the pump's flows, the outlet limit and the number of runs — whose
 * preview shows each run's predicted outlet and interval, the expected standard errors and how
 * evenly spaced flows would compare; saving keeps the plan with the rig and opens the session.
 */
export function SessionPlanner({ rigId, units, sessions, fits, canWrite }: { rigId: string; units: UnitSystem; sessions: SessionListItem[]; fits: PriorFit[]; canWrite: boolean }) {
  const u = displayUnits(units);
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [source, setSource] = useState<'guess' | 'fit'>(fits.length ? 'fit' : 'guess');
  const [preview, setPreview] = useState<{ plan: PlanView; runs: PlannedRun[]; seed: number } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);

  function body(form: HTMLFormElement, save: boolean) {
    const f = new FormData(form);
    const v = (k: string) => String(f.get(k) ?? '').trim().replace(',', '.');
    return {
      title: v('title') || undefined,
      prior: source === 'fit' ? { fitId: v('fitId') } : { Ts: `${v('Ts')} ${u.temp.mathUnit}`, UA: `${v('UA')} W/K` },
      inletTemp: `${v('inlet')} ${u.temp.mathUnit}`,
      flowRange: [`${v('flowLow')} ${u.flow.mathUnit}`, `${v('flowHigh')} ${u.flow.mathUnit}`],
      maxOutletTemp: `${v('limit')} ${u.temp.mathUnit}`,
      trials: Number(v('trials')),
      preset: v('preset'),
      // the saved plan is the one previewed: the same seed of the run order
      ...(save ? (preview ? { seed: preview.seed } : {}) : { preview: true }),
    };
  }

  async function send(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const save = (e.nativeEvent as SubmitEvent).submitter?.getAttribute('value') === 'save';
    setBusy(true);
    setError(null);
    setFields({});
    try {
      const r = await api<{ plan: PlanView; runs: PlannedRun[]; settings: { seed: number }; session?: { id: string } }>(`/api/rigs/${rigId}/sessions`, { body: body(e.currentTarget, save) });
      if (r.session) router.push(`/sessions/${r.session.id}`);
      else setPreview({ plan: r.plan, runs: r.runs, seed: r.settings.seed });
    } catch (err) {
      const f = failureOf(err);
      setError(f.message);
      setFields(f.fields);
    } finally {
      setBusy(false);
    }
  }

  const fe = (...keys: string[]) => {
    const k = keys.find((x) => Object.keys(fields).some((f) => f.startsWith(x)));
    const msg = k ? Object.entries(fields).find(([f]) => f.startsWith(k))![1] : null;
    return msg ? <p className="mt-1 text-sm text-danger-text">{msg}</p> : null;
  };
  const t = (c: number) => u.temp.from(c).toFixed(1);

  return (
    <section className="card mt-6 p-5" aria-label="Test sessions">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 className="text-lg">Test sessions</h2>
        {canWrite ? (
          <button type="button" className="btn-quiet" onClick={() => setOpen(!open)} aria-expanded={open}>
            {open ? 'Hide the plan form' : 'Plan a session'}
          </button>
        ) : null}
      </div>
      {sessions.length ? (
        <ul className="mt-3 space-y-1 text-sm">
          {sessions.map((s) => (
            <li key={s.id} className="flex flex-wrap gap-x-3">
              <Link href={`/sessions/${s.id}`}>{s.title}</Link>
              <span className="text-ink-muted">{s.state}, {s.done} of {s.runs} runs done</span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="mt-2 text-sm text-ink-muted">No sessions yet. A session plans the flows that pin the model down best, then guides the runs at the rig.</p>
      )}
      {open && canWrite ? (
        <form onSubmit={send} className="mt-4 space-y-4" aria-label="Plan a session">
          <fieldset className="space-y-2">
            <legend className="field-label">What is known before</legend>
            <div className="flex gap-4 text-sm">
              <label className="flex items-center gap-2"><input type="radio" name="source" checked={source === 'fit'} onChange={() => setSource('fit')} disabled={!fits.length} /> A saved fit</label>
              <label className="flex items-center gap-2"><input type="radio" name="source" checked={source === 'guess'} onChange={() => setSource('guess')} /> A guess</label>
            </div>
            {source === 'fit' ? (
              <label className="block">
                <span className="field-label">Fit (this rig&apos;s or a similar rig&apos;s)</span>
                <select name="fitId" className="field-input">
                  {fits.map((f) => <option key={f.id} value={f.id}>{f.title} v{f.version} ({f.model})</option>)}
                </select>
                {fe('prior.fitId')}
              </label>
            ) : (
              <div className="grid grid-cols-2 gap-3">
                <label><span className="field-label">Source temperature Ts ({u.temp.label})</span><input name="Ts" inputMode="decimal" className="field-input num" defaultValue={t(85)} />{fe('prior.Ts')}</label>
                <label><span className="field-label">UA (W/K)</span><input name="UA" inputMode="decimal" className="field-input num" defaultValue="400" />{fe('prior.UA')}</label>
              </div>
            )}
          </fieldset>
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
            <label><span className="field-label">Inlet ({u.temp.label})</span><input name="inlet" inputMode="decimal" className="field-input num" defaultValue={t(18)} />{fe('inletTemp')}</label>
            <label><span className="field-label">Lowest flow ({u.flow.label})</span><input name="flowLow" inputMode="decimal" className="field-input num" defaultValue={u.flow.from(2 / 60000).toFixed(1)} />{fe('flowRange')}</label>
            <label><span className="field-label">Highest flow ({u.flow.label})</span><input name="flowHigh" inputMode="decimal" className="field-input num" defaultValue={u.flow.from(20 / 60000).toFixed(1)} /></label>
            <label><span className="field-label">Outlet limit ({u.temp.label})</span><input name="limit" inputMode="decimal" className="field-input num" defaultValue={t(95)} />{fe('maxOutletTemp')}</label>
            <label><span className="field-label">Runs</span><input name="trials" inputMode="numeric" className="field-input num" defaultValue="8" />{fe('trials')}</label>
            <label>
              <span className="field-label">Logger steadiness</span>
              <select name="preset" className="field-input" defaultValue="field">
                <option value="field">Field (fires, burners)</option>
                <option value="laboratory">Laboratory</option>
                <option value="collector">Collector</option>
              </select>
            </label>
            <label className="col-span-2 sm:col-span-3"><span className="field-label">Title</span><input name="title" className="field-input" maxLength={160} placeholder="Morning session" /></label>
          </div>
          {error ? <p role="alert" className="text-sm text-danger-text">{error}</p> : null}
          <div className="flex flex-wrap gap-3">
            <button type="submit" value="preview" className="btn-quiet" disabled={busy}>Preview the plan</button>
            <button type="submit" value="save" className="btn-primary" disabled={busy || !preview}>Save the plan and start</button>
          </div>
          {preview ? (
            <div className="space-y-3" aria-label="Planned runs">
              <table className="w-full text-sm">
                <thead><tr className="text-left text-ink-muted"><th>#</th><th>Flow ({u.flow.label})</th><th>Predicted outlet ({u.temp.label})</th><th>95 % interval</th><th>Purpose</th></tr></thead>
                <tbody>
                  {preview.runs.map((r) => (
                    <tr key={r.key} className="num">
                      <td>{r.order}</td><td>{u.flow.from(r.flowM3PerS).toFixed(2)}</td><td>{t(r.predictedOutletTempC)}</td><td>{t(r.piLowC)}–{t(r.piHighC)}</td><td>{r.purpose}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
              <table className="text-sm" aria-label="Expected standard errors">
                <thead><tr className="text-left text-ink-muted"><th className="pr-4">Expected standard error</th><th className="pr-4">This plan</th><th>Evenly spaced flows</th></tr></thead>
                <tbody>
                  {Object.entries(preview.plan.expectedStdErr).map(([k, v]) => (
                    <tr key={k} className="num"><td className="pr-4">{k} ({PARAM_UNIT[k] ?? 'SI'})</td><td className="pr-4">{v.toPrecision(3)}</td><td>{preview.plan.evenlySpaced.expectedStdErr[k]?.toPrecision(3) ?? '—'}</td></tr>
                  ))}
                  <tr className="num"><td className="pr-4">D-efficiency</td><td className="pr-4">{(preview.plan.dEfficiency * 100).toFixed(0)} %</td><td>{(preview.plan.evenlySpaced.dEfficiency * 100).toFixed(0)} %</td></tr>
                </tbody>
              </table>
              <ul className="list-disc pl-5 text-sm text-ink-soft">{preview.plan.notes.map((n) => <li key={n}>{n}</li>)}</ul>
              <CautionList cautions={preview.plan.cautions} />
            </div>
          ) : null}
        </form>
      ) : null}
    </section>
  );
}
