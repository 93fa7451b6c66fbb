'use client';

import Link from 'next/link';
import { useEffect, useMemo, useState } from 'react';
import { api, ApiError } from '../../_components/api';
import { FillTimer } from '../../_components/fill-timer';
import { CautionList } from '../../_components/safety-notice';
import { checkReading } from '@/analysis/plan/reading-check';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { useReadingQueue, type QueuedReading } from './use-reading-queue';

interface Run { key: string; order: number; flowM3PerS: number; predictedOutletTempC: number; piLowC: number; piHighC: number; inletSlope: number; purpose: string; state: 'pending' | 'done' | 'skipped'; trialIds: string[] }
interface TrialView { id: string; inletTempC: number; outletTempC: number; flowM3PerS: number; origin: string }
interface Closing {
  summary: string[];
  fit: { ok: boolean; reason?: string };
  stdErr: { name: string; fitted: number | null; planned: number | null; ratio: number | null }[];
  nextRun: { ok: boolean; flowM3PerS?: number; predictedOutletTempC?: number; targetParameter?: string; reason?: string };
  drift: { ready: boolean; drifted: boolean; message: string };
  lackOfFit: { verdict: string };
}
export interface SessionView {
  id: string;
  rigId: string;
  title: string;
  state: 'planned' | 'running' | 'closed';
  settings: { inletTempC: number; maxOutletTempC: number; preset: string };
  plan: { cautions?: { code: string; level: 'danger' | 'warning' | 'info'; message: string }[] };
  runs: Run[];
  sampleCount: number;
  trials: TrialView[];
  closing: Closing | null;
  studyId: string | null;
}
interface Live { state: string; message: string; nextRun: Run | null }
interface Recent { tS: number[]; outletTempC: number[] }

const newId = () => crypto.randomUUID();

/** The session at the rig, one run at a time; readings are queued on the phone and synced without duplicates. */
export function SessionRunner({ initial, units, canWrite, canStudy }: { initial: SessionView; units: UnitSystem; canWrite: boolean; canStudy: boolean }) {
  const u = displayUnits(units);
  const [s, setS] = useState(initial);
  const [chosen, setChosen] = useState<string | null>(null);
  const [fills, setFills] = useState<number[]>([]);
  const [bucket, setBucket] = useState('');
  const [inlet, setInlet] = useState(String(+u.temp.from(initial.settings.inletTempC).toFixed(1)));
  const [outlet, setOutlet] = useState('');
  const [keep, setKeep] = useState(false);
  const [result, setResult] = useState<{ check: string | null; inside: boolean; drift: { drifted: boolean; message: string } | null; warnings: string[] } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [addFlow, setAddFlow] = useState('');
  const [live, setLive] = useState<Live | null>(null);
  const [recent, setRecent] = useState<Recent | null>(null);
  const [busy, setBusy] = useState(false);
  const [studyId, setStudyId] = useState(initial.studyId);

  const { queue, offline, add } = useReadingQueue<SessionView>(
    s.id,
    (a) => {
      setS(a.session);
      setResult({ check: a.check?.message ?? null, inside: a.check?.inside ?? true, drift: a.drift?.ready ? a.drift : null, warnings: a.warnings });
    },
    (r, e) => setError(`A reading (run ${s.runs.find((x) => x.key === r.runKey)?.order ?? '?'}) was refused: ${e.message} ${Object.values(e.fields).join(' ')}`),
  );

  useEffect(() => {
    if (s.state === 'closed') return;
    const es = new EventSource(`/api/sessions/${s.id}/events`);
    es.addEventListener('session', (ev) => {
      const d = JSON.parse((ev as MessageEvent).data);
      setLive(d.live);
      setRecent(d.recent);
      setS((prev) => (d.session.sampleCount !== prev.sampleCount || JSON.stringify(d.session.runs) !== JSON.stringify(prev.runs) ? { ...prev, runs: d.session.runs, sampleCount: d.session.sampleCount } : prev));
    });
    return () => es.close();
  }, [s.id, s.state]);

  const queued = new Set(queue.map((q) => q.runKey));
  const ordered = [...s.runs].sort((a, b) => a.order - b.order);
  const next = ordered.find((r) => r.state === 'pending' && !queued.has(r.key)) ?? null;
  const run = ordered.find((r) => r.key === chosen && r.state === 'pending' && !queued.has(r.key)) ?? next;
  const done = s.runs.filter((r) => r.state === 'done').length + queue.length;
  const t = (c: number) => u.temp.from(c).toFixed(1);
  const toC = (text: string) => {
    const v = Number(text.trim().replace(',', '.'));
    return text.trim() && Number.isFinite(v) ? u.temp.to(v) : null;
  };
  const check = useMemo(() => {
    const o = toC(outlet), i = toC(inlet);
    if (!run || o === null || i === null) return null;
    return checkReading({ ...run, planInletTempC: s.settings.inletTempC }, { inletTempC: i, outletTempC: o });
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [outlet, inlet, run?.key]);
  const firstRef = ordered.find((r) => r.purpose === 'reference' && r.state === 'done');
  const firstRefTrial = firstRef ? s.trials.find((x) => firstRef.trialIds.includes(x.id)) : undefined;

  function save(e: React.FormEvent) {
    e.preventDefault();
    if (!run) return;
    setError(null);
    if (check && !check.inside && !keep) {
      setKeep(true);
      return;
    }
    const r: QueuedReading = {
      id: newId(), runKey: run.key, startedAt: new Date().toISOString(),
      inlet: `${inlet.trim().replace(',', '.')} ${u.temp.mathUnit}`, outlet: `${outlet.trim().replace(',', '.')} ${u.temp.mathUnit}`,
      ...(fills.length && bucket.trim() ? { bucketVolume: `${bucket.trim().replace(',', '.')} ${u.volume.mathUnit}`, fillTimesS: fills } : { flow: run.flowM3PerS * 60000 + ' L/min' }),
    };
    add(r);
    setResult(null);
    setOutlet('');
    setFills([]);
    setKeep(false);
    setChosen(null);
  }

  async function change(body: Record<string, unknown>) {
    setBusy(true);
    setError(null);
    try {
      const r = await api<{ session: SessionView }>(`/api/sessions/${s.id}/runs`, { body });
      setS(r.session);
    } catch (e) {
      setError(e instanceof ApiError ? `${e.message} ${Object.values(e.fields).join(' ')}` : 'The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }
  async function close() {
    setBusy(true);
    try {
      const r = await api<{ session: SessionView }>(`/api/sessions/${s.id}/close`, { body: {} });
      setS(r.session);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }
  async function study() {
    setBusy(true);
    try {
      setStudyId((await api<{ studyId: string }>(`/api/sessions/${s.id}/study`, { body: {} })).studyId);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="mx-auto max-w-xl space-y-5">
      <div>
        <p className="text-sm text-ink-muted" aria-live="polite">
          {done} of {s.runs.filter((r) => r.state !== 'skipped').length} runs done{queue.length ? ` · ${queue.length} saved on this phone, ${offline ? 'waiting for signal' : 'syncing'}` : ''}
        </p>
        <div className="mt-1 h-2 rounded bg-paper-deep" role="progressbar" aria-label="Progress" aria-valuemin={0} aria-valuemax={s.runs.length} aria-valuenow={done}>
          <div className="h-2 rounded bg-ember-600" style={{ width: `${Math.round((100 * done) / Math.max(1, s.runs.filter((r) => r.state !== 'skipped').length))}%` }} />
        </div>
      </div>
      {s.plan.cautions?.length ? <CautionList cautions={s.plan.cautions} /> : null}
      {live && (s.sampleCount > 0 || live.state !== 'waiting') ? (
        <section className="card p-4" aria-label="Logger">
          <p className={`text-lg font-semibold ${live.state === 'record' ? 'text-water-800' : live.state === 'changed' ? 'text-ember-700' : ''}`} role="status">{live.message}</p>
          {recent && recent.tS.length > 1 ? <Sparkline recent={recent} /> : null}
          <p className="text-sm text-ink-muted">{s.sampleCount.toLocaleString('en-US')} samples · steadiness: {s.settings.preset}</p>
        </section>
      ) : null}
      {error ? <p role="alert" className="rounded-lg bg-danger-bg p-3 text-sm text-danger-text">{error}</p> : null}
      {result ? (
        <section className="card space-y-2 p-4" role="status" aria-label="Last reading">
          <p className={result.inside ? '' : 'text-caution-text'}>{result.inside ? 'Saved.' : 'Saved, outside the prediction (kept).'} {result.check}</p>
          {result.drift ? (
            <div className={`rounded-lg p-3 ${result.drift.drifted ? 'bg-caution-bg text-caution-text' : 'bg-paper-deep'}`}>
              <h3 className="font-semibold">Drift check</h3>
              <p>{result.drift.message}</p>
            </div>
          ) : null}
          {result.warnings.map((w) => <p key={w} className="text-sm text-caution-text">{w}</p>)}
        </section>
      ) : null}
      {s.state !== 'closed' && run && canWrite ? (
        <form onSubmit={save} className="card space-y-4 p-4" aria-label="Current run">
          <div>
            <p className="text-sm text-ink-muted">Run {run.order} · {run.purpose}</p>
            <p className="text-2xl font-semibold">Set the flow to <span className="num">{u.flow.from(run.flowM3PerS).toFixed(1)} {u.flow.label}</span></p>
            <p className="text-sm">Predicted outlet <span className="num">{t(run.predictedOutletTempC)}</span> ({t(run.piLowC)}–{t(run.piHighC)}) {u.temp.label}</p>
            {run.purpose === 'reference' && firstRefTrial ? <p className="mt-1 text-sm text-water-800">Reference flow again: the reading is compared with run {firstRef!.order} ({t(firstRefTrial.outletTempC)} {u.temp.label}) for drift.</p> : null}
          </div>
          <label className="block">
            <span className="field-label">Bucket volume ({u.volume.label})</span>
            <input value={bucket} onChange={(e) => setBucket(e.target.value)} inputMode="decimal" className="field-input num text-lg" />
          </label>
          <FillTimer fills={fills} onChange={setFills} />
          <div className="grid grid-cols-2 gap-3">
            <label>
              <span className="field-label">Inlet ({u.temp.label})</span>
              <input value={inlet} onChange={(e) => setInlet(e.target.value)} inputMode="decimal" required className="field-input num text-lg" />
            </label>
            <label>
              <span className="field-label">Outlet ({u.temp.label})</span>
              <input value={outlet} onChange={(e) => { setOutlet(e.target.value); setKeep(false); }} inputMode="decimal" required className="field-input num text-lg" />
            </label>
          </div>
          {check ? <p className={`text-sm ${check.inside ? 'text-water-800' : 'font-semibold text-caution-text'}`} role="status" aria-label="Reading check">{check.inside ? `Within the predicted ${t(check.piLowC)}–${t(check.piHighC)} ${u.temp.label}.` : `Outside the predicted ${t(check.piLowC)}–${t(check.piHighC)} ${u.temp.label}: check the thermometer is in the stream and the flow is as set, then read again or keep it.`}</p> : null}
          <button type="submit" className="btn-primary w-full py-4 text-lg">{keep ? 'Keep this reading' : 'Save reading'}</button>
          <div className="flex flex-wrap gap-2">
            <button type="button" className="btn-quiet" disabled={busy} onClick={() => change({ action: 'skip', runKey: run.key })}>Skip this run</button>
            <button type="button" className="btn-quiet" disabled={busy} onClick={() => change({ action: 'repeat', runKey: run.key })}>Repeat it later</button>
          </div>
        </form>
      ) : null}
      {s.state !== 'closed' && !run ? <p className="card p-4">Every run of the plan is done{queue.length ? ' (some readings still syncing)' : ''}: close the session for the verdict.</p> : null}
      <section aria-label="Runs">
        <h2 className="text-lg">Runs</h2>
        <ol className="mt-2 space-y-1 text-sm">
          {ordered.map((r) => {
            const tr = s.trials.find((x) => r.trialIds.includes(x.id));
            const waiting = queued.has(r.key);
            return (
              <li key={r.key} className="flex flex-wrap items-center gap-x-2">
                <span className="num w-6">{r.order}</span>
                <span className="num">{u.flow.from(r.flowM3PerS).toFixed(1)} {u.flow.label}</span>
                <span className="text-ink-muted">{r.purpose}</span>
                <span>{waiting ? 'saved on phone' : r.state}{tr ? ` · ${t(tr.outletTempC)} ${u.temp.label}` : ''}</span>
                {canWrite && s.state !== 'closed' && r.state === 'pending' && !waiting && r.key !== run?.key ? <button type="button" className="text-water-800 underline" onClick={() => setChosen(r.key)}>Do now</button> : null}
                {canWrite && s.state !== 'closed' && r.state === 'skipped' ? <button type="button" className="text-water-800 underline" onClick={() => change({ action: 'reopen', runKey: r.key })}>Take up again</button> : null}
              </li>
            );
          })}
        </ol>
        {canWrite && s.state !== 'closed' ? (
          <div className="mt-3 flex items-end gap-2">
            <label className="flex-1">
              <span className="field-label">Add a run at ({u.flow.label})</span>
              <input value={addFlow} onChange={(e) => setAddFlow(e.target.value)} inputMode="decimal" className="field-input num" />
            </label>
            <button type="button" className="btn-quiet" disabled={busy || !addFlow.trim()} onClick={() => change({ action: 'add', flow: `${addFlow.trim().replace(',', '.')} ${u.flow.mathUnit}` }).then(() => setAddFlow(''))}>Add run</button>
          </div>
        ) : null}
      </section>
      {s.state !== 'closed' && canWrite ? (
        <button type="button" className="btn-quiet w-full" disabled={busy || queue.length > 0} onClick={close}>Close the session</button>
      ) : null}
      {s.closing ? (
        <section className="card space-y-3 p-4" aria-label="Verdict">
          <h2 className="text-lg">Verdict</h2>
          <ul className="list-disc space-y-1 pl-5">{s.closing.summary.map((x) => <li key={x}>{x}</li>)}</ul>
          {s.closing.stdErr.length ? (
            <table className="text-sm" aria-label="Standard errors">
              <thead><tr className="text-left text-ink-muted"><th className="pr-3">Parameter</th><th className="pr-3">After the session</th><th>Plan expected</th></tr></thead>
              <tbody>{s.closing.stdErr.map((e) => <tr key={e.name} className="num"><td className="pr-3">{e.name}</td><td className="pr-3">{e.fitted?.toPrecision(3) ?? '—'}</td><td>{e.planned?.toPrecision(3) ?? '—'}</td></tr>)}</tbody>
            </table>
          ) : null}
          {s.closing.nextRun.ok ? <p className="font-semibold">Next best run: {u.flow.from(s.closing.nextRun.flowM3PerS!).toFixed(1)} {u.flow.label} (outlet about {t(s.closing.nextRun.predictedOutletTempC!)} {u.temp.label}), to pin down {s.closing.nextRun.targetParameter}.</p> : null}
          {studyId ? (
            <Link className="btn-primary inline-block" href={`/studies/${studyId}`}>Open the study</Link>
          ) : canStudy && s.closing.fit.ok ? (
            <button type="button" className="btn-primary" disabled={busy} onClick={study}>Make a study from this session</button>
          ) : null}
        </section>
      ) : null}
    </div>
  );
}

function Sparkline({ recent }: { recent: Recent }) {
  const w = 320, h = 60;
  const t0 = recent.tS[0], t1 = recent.tS[recent.tS.length - 1] || 1;
  const lo = Math.min(...recent.outletTempC), hi = Math.max(...recent.outletTempC);
  const span = hi - lo || 1;
  const pts = recent.tS.map((x, i) => `${(((x - t0) / (t1 - t0 || 1)) * w).toFixed(1)},${(h - ((recent.outletTempC[i] - lo) / span) * h).toFixed(1)}`).join(' ');
  return (
    <svg viewBox={`0 0 ${w} ${h}`} className="mt-2 h-16 w-full" role="img" aria-label={`Outlet over the last ${Math.round(-t0 / 60)} minutes, ${lo.toFixed(1)} to ${hi.toFixed(1)} °C`}>
      <polyline points={pts} fill="none" stroke="currentColor" strokeWidth="1.5" className="text-ember-600" />
    </svg>
  );
}
