'use client';

import { useState } from 'react';
import { api, ApiError } from './api';
import { DEFAULT_TRIAL_QUERY, useTrials, type TrialQuery } from './use-trials';
import type { TrialDto } from '../_contracts/dto';
import { TempValue, TemperatureCautions } from './safety-notice';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

const fmt = (v: number, d: number) => v.toFixed(d);

/** The trials of one rig: server-side paging, sorting and filtering; writers edit notes and exclude trials. */
export function TrialsTable({ rigId, units, canWrite }: { rigId: string; units: UnitSystem; canWrite: boolean }) {
  const [q, setQ] = useState<TrialQuery>(DEFAULT_TRIAL_QUERY);
  const [selected, setSelected] = useState<Set<string>>(new Set());
  const [error, setError] = useState<string | null>(null);
  const { data, mutate, isLoading } = useTrials(rigId, q);
  const rows = data?.trials ?? [];
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  const set = (patch: Partial<TrialQuery>) => setQ((old) => ({ ...old, page: 1, ...patch }));
  const sortBy = (sort: TrialQuery['sort']) => set({ sort, dir: q.sort === sort && q.dir === 'asc' ? 'desc' : 'asc' });

  async function bulk(excluded: boolean) {
    setError(null);
    try {
      await api(`/api/rigs/${rigId}/trials/bulk`, { body: { ids: [...selected], patch: { excluded } } });
      setSelected(new Set());
      await mutate();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    }
  }

  async function saveNotes(t: TrialDto, notes: string) {
    if (notes === t.notes) return;
    try {
      await api(`/api/trials/${t.id}`, { method: 'PATCH', body: { notes } });
      await mutate();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    }
  }

  const sorting = { q, sortBy };

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-3" role="search">
        <label className="text-sm">
          <span className="field-label">Show</span>
          <select className="field-input" value={q.excluded} onChange={(e) => set({ excluded: e.target.value as TrialQuery['excluded'] })}>
            <option value="all">all trials</option>
            <option value="included">included only</option>
            <option value="excluded">excluded only</option>
          </select>
        </label>
        <label className="flex items-center gap-2 pb-2 text-sm">
          <input type="checkbox" checked={q.reference === 'only'} onChange={(e) => set({ reference: e.target.checked ? 'only' : 'all' })} />
          reference flows only
        </label>
        <label className="text-sm">
          <span className="field-label">Notes contain</span>
          <input className="field-input" value={q.q} onChange={(e) => set({ q: e.target.value })} placeholder="e.g. wind" />
        </label>
        {canWrite ? (
          <div className="flex gap-2 pb-0.5">
            <button type="button" className="btn-quiet" disabled={!selected.size} onClick={() => bulk(true)}>
              Exclude {selected.size || ''}
            </button>
            <button type="button" className="btn-quiet" disabled={!selected.size} onClick={() => bulk(false)}>
              Include {selected.size || ''}
            </button>
          </div>
        ) : null}
      </div>
      {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-sm text-danger-text">{error}</p> : null}
      <TemperatureCautions units={units}
        label="Cautions for these trials"
        places={[
          { where: 'outlet', valuesC: [data?.hottest?.outletTempC, ...rows.map((r) => r.outletTempC)] },
          { where: 'inlet', valuesC: [data?.hottest?.inletTempC, ...rows.map((r) => r.inletTempC)] },
        ]}
      />
      <div className="card relative overflow-x-auto" aria-busy={isLoading} tabIndex={0}>
        <table className="data-table">
          <thead>
            <tr>
              {canWrite ? (
                <th scope="col">
                  <input
                    type="checkbox"
                    aria-label="Select all trials on this page"
                    checked={rows.length > 0 && rows.every((r) => selected.has(r.id))}
                    onChange={(e) => setSelected(e.target.checked ? new Set(rows.map((r) => r.id)) : new Set())}
                  />
                </th>
              ) : null}
              <Th sorting={sorting} s="startedAt">Started (UTC)</Th>
              <Th sorting={sorting} s="flowM3PerS" right>Flow ({displayUnits(units).flow.label})</Th>
              <Th sorting={sorting} s="inletTempC" right>Inlet ({displayUnits(units).temp.label})</Th>
              <Th sorting={sorting} s="outletTempC" right>Outlet ({displayUnits(units).temp.label})</Th>
              <Th right>ΔT ({displayUnits(units).tempDiff.label})</Th>
              <Th>Notes</Th>
            </tr>
          </thead>
          <tbody>
            {rows.map((t) => (
              <tr key={t.id} className={t.excluded ? 'bg-paper-deep text-ink-muted' : ''}>
                {canWrite ? (
                  <td>
                    <input
                      type="checkbox"
                      aria-label={`Select trial of ${t.startedAt.slice(0, 16).replace('T', ' ')}`}
                      checked={selected.has(t.id)}
                      onChange={(e) => {
                        const next = new Set(selected);
                        if (e.target.checked) next.add(t.id);
                        else next.delete(t.id);
                        setSelected(next);
                      }}
                    />
                  </td>
                ) : null}
                <td className="num whitespace-nowrap">
                  {t.startedAt.slice(0, 16).replace('T', ' ')}
                  {t.excluded ? <span className="ml-2 rounded bg-white px-1.5 py-0.5 text-xs text-ink-muted ring-1 ring-paper-line">excluded</span> : null}
                </td>
                <td className="num text-right">{fmt(displayUnits(units).flow.from(t.flowM3PerS), 2)}</td>
                <td className="num text-right"><TempValue tempC={t.inletTempC} units={units} /></td>
                <td className="num text-right"><TempValue tempC={t.outletTempC} units={units} /></td>
                <td className="num text-right">{fmt(displayUnits(units).tempDiff.from(t.outletTempC - t.inletTempC), 1)}</td>
                <td className="min-w-[14rem] text-sm">
                  {t.isReference ? <span className="mr-1 rounded bg-water-50 px-1.5 py-0.5 text-xs font-medium text-water-800">reference</span> : null}
                  {t.origin === 'log-segment' ? <span title={`A steady period of a sensor log, from line ${t.sourceLine ?? '?'}`} className="mr-1 rounded bg-paper-deep px-1.5 py-0.5 text-xs text-ink-soft">logged</span> : null}
                  {t.warnings.map((w) => (
                    <span key={w} title={w} className="mr-1 rounded bg-caution-bg px-1.5 py-0.5 text-xs text-caution-text">
                      <span aria-hidden="true">check</span>
                      <span className="sr-only">Check: {w}</span>
                    </span>
                  ))}
                  {canWrite ? (
                    <input
                      aria-label="Notes"
                      className="w-full rounded border border-transparent bg-transparent px-1 py-0.5 hover:border-paper-line focus:border-ember-500"
                      defaultValue={t.notes}
                      onBlur={(e) => saveNotes(t, e.target.value)}
                    />
                  ) : (
                    t.notes
                  )}
                </td>
              </tr>
            ))}
            {!isLoading && rows.length === 0 ? (
              <tr>
                <td colSpan={7} className="text-ink-muted">No trials match.</td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
      <nav aria-label="Pages" className="flex items-center justify-between text-sm">
        <span className="text-ink-muted">
          {isLoading && !data ? 'Loading trials…' : <><span className="num">{data?.total ?? 0}</span> trials</>}
        </span>
        <span className="flex items-center gap-2">
          <button type="button" className="btn-quiet" disabled={q.page <= 1} onClick={() => setQ({ ...q, page: q.page - 1 })}>
            Previous
          </button>
          <span className="num">
            {q.page} / {pages}
          </span>
          <button type="button" className="btn-quiet" disabled={q.page >= pages} onClick={() => setQ({ ...q, page: q.page + 1 })}>
            Next
          </button>
        </span>
      </nav>
    </div>
  );
}

/** A column head; a sortable one is a button that sorts by it (again: the other way). */
function Th({ s, children, right, sorting }: { s?: TrialQuery['sort']; children: React.ReactNode; right?: boolean; sorting?: { q: TrialQuery; sortBy: (s: TrialQuery['sort']) => void } }) {
  const active = s && sorting && sorting.q.sort === s;
  return (
    <th scope="col" className={right ? 'text-right' : ''} aria-sort={s && sorting ? (active ? (sorting.q.dir === 'asc' ? 'ascending' : 'descending') : 'none') : undefined}>
      {s && sorting ? (
        <button type="button" className="font-semibold text-ink-soft hover:text-ink" onClick={() => sorting.sortBy(s)}>
          {children}
          {active ? (sorting.q.dir === 'asc' ? ' ▲' : ' ▼') : ''}
        </button>
      ) : (
        children
      )}
    </th>
  );
}
