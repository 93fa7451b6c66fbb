'use client';

import { useMemo, useState } from 'react';
import { api, failureOf } from '../../_components/api';
import { OperatingPlanView, PlanCautions } from '../../_components/operating-plan-view';
import {
  checkOperatingPlan, LOOP_LABELS, LOOP_KINDS, MAX_PLAN_STEPS, PLAN_VALVES, RELIEF_KINDS, RELIEF_LABELS, STEP_KIND_CHOICES, VALVE_LABELS,
  type LoopFacts, type OperatingPlanDto, type OperatingStep, type OperatingStepKind, type PlanValve,
} from '@/app/_contracts/operating-plan';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

/** A step as the form holds it: quantities as typed, in the reader's units. */
interface Row { key: number; kind: OperatingStepKind; valve: PlanValve; flow: string; minutes: string; coilBelow: string }
interface Draft { id: string | null; name: string; loop: LoopFacts; rows: Row[] }

let seq = 0;
const nextKey = () => ++seq;

/** The safe order a new plan starts from (common practice): flow first, fire, fire out, pump until cold. */
const SAFE_ORDER: OperatingStep[] = [
  { kind: 'cover-off' }, { kind: 'valve-open', valve: 'supply' }, { kind: 'valve-open', valve: 'return' }, { kind: 'pump-on' }, { kind: 'flow-set', flowM3PerS: 12 / 60000 },
  { kind: 'fire-lit' }, { kind: 'wait', minutes: 60 }, { kind: 'fire-out' }, { kind: 'wait-until-cold', coilBelowC: 35 }, { kind: 'pump-off' }, { kind: 'cover-on' },
];

function toRow(s: OperatingStep, units: UnitSystem): Row {
  const u = displayUnits(units);
  return {
    key: nextKey(), kind: s.kind, valve: s.valve ?? 'supply',
    flow: s.flowM3PerS !== undefined ? String(Math.round(u.flow.from(s.flowM3PerS) * 100) / 100) : '',
    minutes: s.minutes !== undefined ? String(s.minutes) : '',
    coilBelow: s.coilBelowC !== undefined ? String(Math.round(u.temp.from(s.coilBelowC) * 10) / 10) : '',
  };
}

const numberOf = (t: string) => (t.trim() === '' ? NaN : Number(t.trim().replace(',', '.')));

/** A row in SI, or the problem with it in words. */
function toStep(r: Row, units: UnitSystem): OperatingStep | string {
  const u = displayUnits(units);
  const field = STEP_KIND_CHOICES.find((c) => c.kind === r.kind)?.field;
  if (field === 'valve') return { kind: r.kind, valve: r.valve };
  if (field === 'flow') {
    const v = numberOf(r.flow);
    return Number.isFinite(v) && v >= 0 ? { kind: r.kind, flowM3PerS: u.flow.to(v) } : `give the flow in ${u.flow.label} (0 or more)`;
  }
  if (field === 'minutes') {
    const v = numberOf(r.minutes);
    return Number.isFinite(v) && v > 0 ? { kind: r.kind, minutes: v } : 'give the minutes to wait (more than 0)';
  }
  if (field === 'coilBelow') {
    const v = numberOf(r.coilBelow);
    return Number.isFinite(v) ? { kind: r.kind, coilBelowC: u.temp.to(v) } : `give the coil temperature in ${u.temp.label}`;
  }
  return { kind: r.kind };
}

/**
 * The rig page's operating plans: the saved plans with their cautions, and for engineers and
 * owners a form — steps added, removed and reordered, the quantity each kind needs, the loop's
 * facts — whose cautions are raised as the user edits by the same checker the server runs.
 */
export function OperatingPlans({ rigId, units, initial, canWrite }: { rigId: string; units: UnitSystem; initial: OperatingPlanDto[]; canWrite: boolean }) {
  const u = displayUnits(units);
  const [plans, setPlans] = useState(initial);
  const [draft, setDraft] = useState<Draft | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const [saved, setSaved] = useState<string | null>(null);

  const checked = useMemo(() => {
    if (!draft) return null;
    const steps = draft.rows.map((r) => toStep(r, units));
    const problems = steps.map((s, i) => (typeof s === 'string' ? `Step ${i + 1}: ${s}.` : null)).filter((x): x is string => !!x);
    if (problems.length) return { steps: null, problems, cautions: [] };
    const ok = steps as OperatingStep[];
    return { steps: ok, problems, cautions: checkOperatingPlan(ok, draft.loop) };
  }, [draft, units]);

  const open = (p: OperatingPlanDto | null) => {
    setError(null);
    setFields({});
    setSaved(null);
    setDraft(p ? { id: p.id, name: p.name, loop: p.loop, rows: p.steps.map((s) => toRow(s, units)) } : { id: null, name: '', loop: { loop: 'open', relief: 'none' }, rows: SAFE_ORDER.map((s) => toRow(s, units)) });
  };
  const setRows = (f: (rows: Row[]) => Row[]) => setDraft((d) => (d ? { ...d, rows: f(d.rows) } : d));
  const setRow = (i: number, patch: Partial<Row>) => setRows((rows) => rows.map((r, j) => (j === i ? { ...r, ...patch } : r)));
  const move = (i: number, by: number) => setRows((rows) => {
    const j = i + by;
    if (j < 0 || j >= rows.length) return rows;
    const next = [...rows];
    [next[i], next[j]] = [next[j], next[i]];
    return next;
  });

  async function save(e: React.FormEvent) {
    e.preventDefault();
    if (!draft || !checked?.steps) return;
    setBusy(true);
    setError(null);
    setFields({});
    try {
      const body = { name: draft.name, loop: draft.loop, steps: checked.steps };
      const r = draft.id
        ? await api<{ plan: OperatingPlanDto }>(`/api/plans/${draft.id}`, { method: 'PUT', body })
        : await api<{ plan: OperatingPlanDto }>(`/api/rigs/${rigId}/plans`, { body });
      setPlans((ps) => (draft.id ? ps.map((p) => (p.id === r.plan.id ? r.plan : p)) : [...ps, r.plan]));
      setDraft(null);
      setSaved(`Saved “${r.plan.name}”.`);
    } catch (err) {
      const f = failureOf(err);
      setError(f.message);
      setFields(f.fields);
    } finally {
      setBusy(false);
    }
  }

  async function remove() {
    if (!draft?.id || !window.confirm(`Delete the plan “${draft.name}”?`)) return;
    setBusy(true);
    try {
      await api(`/api/plans/${draft.id}`, { method: 'DELETE' });
      setPlans((ps) => ps.filter((p) => p.id !== draft.id));
      setDraft(null);
    } catch (err) {
      setError(failureOf(err).message);
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card mt-6 p-5" aria-label="Operating plan">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h2 className="text-lg">Operating plan</h2>
        {canWrite && !draft ? (
          <button type="button" className="btn-quiet" onClick={() => open(null)}>
            New plan
          </button>
        ) : null}
      </div>
      <p className="mt-1 text-sm text-ink-muted">The order of running the rig — pump, valves, flow, fire, waits, cover — checked for the hazards of a coil over a fire.</p>
      {saved ? <p role="status" className="mt-2 text-sm text-ink-soft">{saved}</p> : null}
      {!draft ? (
        plans.length ? (
          <ul className="mt-4 space-y-4">
            {plans.map((p) => (
              <li key={p.id} className="rounded-lg border border-paper-line p-4" aria-label={`Plan ${p.name}`}>
                <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
                  <h3 className="text-base font-semibold">{p.name}</h3>
                  {canWrite ? (
                    <button type="button" className="btn-quiet px-3 py-1" onClick={() => open(p)}>
                      Edit plan
                    </button>
                  ) : null}
                </div>
                <OperatingPlanView plan={p} units={units} />
              </li>
            ))}
          </ul>
        ) : (
          <p className="mt-3 text-sm text-ink-muted">No plan yet.{canWrite ? ' A new plan starts from the safe order: flow before fire, and the pump kept running until the coil is cold.' : ''}</p>
        )
      ) : (
        <form onSubmit={save} className="mt-4 space-y-4" aria-label={draft.id ? 'Edit the operating plan' : 'New operating plan'}>
          <label className="block max-w-md">
            <span className="field-label">Plan name</span>
            <input className="field-input" maxLength={120} value={draft.name} onChange={(e) => setDraft({ ...draft, name: e.target.value })} placeholder="Morning heat-up" />
            {fields.name ? <p className="mt-1 text-sm text-danger-text">{fields.name}</p> : null}
          </label>
          <div className="grid gap-3 sm:grid-cols-2">
            <label className="block">
              <span className="field-label">Loop</span>
              <select className="field-input" value={draft.loop.loop} onChange={(e) => setDraft({ ...draft, loop: { ...draft.loop, loop: e.target.value as LoopFacts['loop'] } })}>
                {LOOP_KINDS.map((k) => <option key={k} value={k}>{LOOP_LABELS[k]}</option>)}
              </select>
            </label>
            <label className="block">
              <span className="field-label">Relief path</span>
              <select className="field-input" value={draft.loop.relief} onChange={(e) => setDraft({ ...draft, loop: { ...draft.loop, relief: e.target.value as LoopFacts['relief'] } })}>
                {RELIEF_KINDS.map((k) => <option key={k} value={k}>{RELIEF_LABELS[k]}</option>)}
              </select>
            </label>
          </div>
          <ol className="space-y-2" aria-label="Steps of the plan">
            {draft.rows.map((r, i) => {
              const field = STEP_KIND_CHOICES.find((c) => c.kind === r.kind)?.field;
              const n = i + 1;
              const marked = checked?.cautions.some((c) => c.step === n);
              return (
                <li key={r.key} className={`flex flex-wrap items-end gap-2 rounded-lg border p-2 ${marked ? 'border-danger-line bg-danger-bg' : 'border-paper-line'}`}>
                  <span className="num w-6 self-center text-right text-sm text-ink-muted">{n}.</span>
                  <label className="min-w-0 flex-1 basis-48">
                    <span className="sr-only">Step {n}</span>
                    <select aria-label={`Step ${n}`} className="field-input mt-0" value={r.kind} onChange={(e) => setRow(i, { kind: e.target.value as OperatingStepKind })}>
                      {STEP_KIND_CHOICES.map((c) => <option key={c.kind} value={c.kind}>{c.label}</option>)}
                    </select>
                  </label>
                  {field === 'valve' ? (
                    <select aria-label={`Valve of step ${n}`} className="field-input mt-0 w-auto" value={r.valve} onChange={(e) => setRow(i, { valve: e.target.value as PlanValve })}>
                      {PLAN_VALVES.map((v) => <option key={v} value={v}>{VALVE_LABELS[v]}</option>)}
                    </select>
                  ) : field === 'flow' ? (
                    <label className="flex items-center gap-1 text-sm">
                      <input aria-label={`Flow of step ${n} (${u.flow.label})`} inputMode="decimal" className="field-input num mt-0 w-24" value={r.flow} onChange={(e) => setRow(i, { flow: e.target.value })} />
                      {u.flow.label}
                    </label>
                  ) : field === 'minutes' ? (
                    <label className="flex items-center gap-1 text-sm">
                      <input aria-label={`Minutes of step ${n}`} inputMode="decimal" className="field-input num mt-0 w-20" value={r.minutes} onChange={(e) => setRow(i, { minutes: e.target.value })} />
                      min
                    </label>
                  ) : field === 'coilBelow' ? (
                    <label className="flex items-center gap-1 text-sm">
                      below
                      <input aria-label={`Coil temperature of step ${n} (${u.temp.label})`} inputMode="decimal" className="field-input num mt-0 w-20" value={r.coilBelow} onChange={(e) => setRow(i, { coilBelow: e.target.value })} />
                      {u.temp.label}
                    </label>
                  ) : null}
                  <span className="flex gap-1">
                    <button type="button" className="btn-quiet px-2 py-1" aria-label={`Move step ${n} up`} onClick={() => move(i, -1)} disabled={i === 0}>↑</button>
                    <button type="button" className="btn-quiet px-2 py-1" aria-label={`Move step ${n} down`} onClick={() => move(i, 1)} disabled={i === draft.rows.length - 1}>↓</button>
                    <button type="button" className="btn-quiet px-2 py-1" aria-label={`Remove step ${n}`} onClick={() => setRows((rows) => rows.filter((_, j) => j !== i))}>✕</button>
                  </span>
                  {Object.entries(fields).filter(([k]) => k.startsWith(`steps.${i}.`) || k === `steps.${i}`).map(([k, m]) => <p key={k} className="w-full text-sm text-danger-text">{m}</p>)}
                </li>
              );
            })}
          </ol>
          <button type="button" className="btn-quiet" disabled={draft.rows.length >= MAX_PLAN_STEPS} onClick={() => setRows((rows) => [...rows, toRow({ kind: 'pump-on' }, units)])}>
            Add a step
          </button>
          <div aria-live="polite" className="space-y-2">
            {checked?.problems.length ? (
              <ul className="text-sm text-danger-text">{checked.problems.map((p) => <li key={p}>{p}</li>)}</ul>
            ) : checked?.steps ? (
              <PlanCautions cautions={checked.cautions} label="Cautions of this plan as it stands" />
            ) : null}
          </div>
          {error ? <p role="alert" className="text-sm text-danger-text">{error}</p> : null}
          <div className="flex flex-wrap gap-2">
            <button type="submit" className="btn-primary" disabled={busy || !checked?.steps || !draft.rows.length}>
              {busy ? 'Saving…' : 'Save plan'}
            </button>
            <button type="button" className="btn-quiet" onClick={() => setDraft(null)}>Cancel</button>
            {draft.id ? <button type="button" className="btn-quiet" onClick={remove} disabled={busy}>Delete plan</button> : null}
          </div>
        </form>
      )}
    </section>
  );
}
