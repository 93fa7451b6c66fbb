'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useRef, useState } from 'react';
import { useSWRConfig } from 'swr';
import { api, ApiError } from '../../_components/api';
import type { StudyRecord } from '../../_contracts/study-blocks';
import { studyBlockKey, studyKey } from '../../_contracts/study-keys';
import { CostSettings, SensorLogSettings, costDefaults } from './block-settings';
import type { UnitSystem } from '@/analysis/units/unit-system';

type Kind = 'text' | 'trials' | 'fit' | 'comparison' | 'performance' | 'forecast' | 'costs' | 'sensor-log' | 'caution';
interface Block {
  id: string;
  kind: Kind;
  data: Record<string, unknown>;
}
interface StudyState {
  title: string;
  blocks: Block[];
  revision: number;
}

const KINDS: { kind: Kind; label: string }[] = [
  { kind: 'text', label: 'Text' },
  { kind: 'fit', label: 'Fit with plots' },
  { kind: 'comparison', label: 'Model comparison' },
  { kind: 'performance', label: 'Performance table' },
  { kind: 'trials', label: 'Trial table' },
  { kind: 'forecast', label: 'Forecast' },
  { kind: 'costs', label: 'Cost sheet' },
  { kind: 'sensor-log', label: 'Sensor log' },
  { kind: 'caution', label: 'Caution box' },
];
const label = (k: Kind) => KINDS.find((x) => x.kind === k)?.label ?? k;
const newId = () => Math.random().toString(36).slice(2, 10);

/**
 * The ids of the blocks whose shown data changes from `before` to `after`: new or edited blocks,
 * and cost sheets that take their heat from an edited forecast block. Moved or deleted blocks
 * need no new data.
 */
export function changedBlocks(before: readonly Block[], after: readonly Block[]): string[] {
  const old = new Map(before.map((b) => [b.id, JSON.stringify([b.kind, b.data])]));
  const changed = new Set(after.filter((b) => old.get(b.id) !== JSON.stringify([b.kind, b.data])).map((b) => b.id));
  for (const b of after) if (b.kind === 'costs' && changed.has(String(b.data.forecastBlockId))) changed.add(b.id);
  return [...changed];
}

/**
 * Edits a study's blocks and saves automatically against the revision it loaded. When someone
 * else saved in between, nothing is overwritten: the conflict is shown with a choice. After a save
 * the study's SWR entry takes the saved version and only the blocks whose settings changed fetch
 * their data again.
 */
export function StudyEditor({ studyId, initial, initialReviewState, fits, logs, units }: {
  studyId: string;
  initial: StudyState;
  initialReviewState: string;
  fits: { id: string; label: string; coil: boolean }[];
  logs: { id: string; label: string }[];
  units: UnitSystem;
}) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const [s, setS] = useState<StudyState>(initial);
  const [status, setStatus] = useState<'saved' | 'pending' | 'saving' | 'conflict' | 'error'>('saved');
  const [message, setMessage] = useState<string | null>(null);
  const [theirs, setTheirs] = useState<StudyRecord['study'] | null>(null);
  const dirty = useRef(false);
  /** the blocks as last saved (or taken from the other editor), to find what changed */
  const shown = useRef<Block[]>(initial.blocks);

  /** Puts a saved version into the study's SWR entry and refreshes the blocks it changed. */
  const reviewState = useRef(initialReviewState);
  const publish = (study: StudyRecord['study']) => {
    const changed = changedBlocks(shown.current, study.blocks as Block[]);
    shown.current = study.blocks as Block[];
    void mutate(studyKey(studyId), (old?: StudyRecord) => ({ ...old, study }), { revalidate: false });
    for (const id of changed) void mutate(studyBlockKey(studyId, id));
    // an edit sends an approved study back to draft: the review panel (server-rendered) shows it
    if (study.reviewState !== reviewState.current) router.refresh();
    reviewState.current = study.reviewState;
  };

  const change = (next: Partial<StudyState>) => {
    setS((old) => ({ ...old, ...next }));
    dirty.current = true;
    setStatus('pending');
  };
  const setBlock = (i: number, b: Partial<Block>) => change({ blocks: s.blocks.map((x, j) => (j === i ? { ...x, ...b } : x)) });
  const setData = (i: number, d: Record<string, unknown>) => setBlock(i, { data: { ...s.blocks[i].data, ...d } });
  const move = (i: number, by: number) => {
    const j = i + by;
    if (j < 0 || j >= s.blocks.length) return;
    const blocks = [...s.blocks];
    [blocks[i], blocks[j]] = [blocks[j], blocks[i]];
    change({ blocks });
  };

  useEffect(() => {
    if (status !== 'pending') return;
    const t = setTimeout(async () => {
      if (!dirty.current) return;
      dirty.current = false;
      setStatus('saving');
      try {
        const r = await api<StudyRecord>(`/api/studies/${studyId}`, { method: 'PUT', body: { title: s.title, blocks: s.blocks, baseRevision: s.revision } });
        setS((old) => ({ ...old, revision: r.study.revision }));
        setStatus(dirty.current ? 'pending' : 'saved');
        setMessage(null);
        publish(r.study);
      } catch (e) {
        if (e instanceof ApiError && e.status === 409 && e.body.current) {
          setTheirs(e.body.current as StudyRecord['study']);
          setStatus('conflict');
          setMessage(e.message);
        } else {
          setStatus('error');
          setMessage(e instanceof ApiError ? [e.message, ...Object.values(e.fields)].join(' ') : 'Not saved: the server could not be reached. Your edits stay here; they save when it answers.');
          dirty.current = true;
        }
      }
    }, 800);
    return () => clearTimeout(t);
    // publish is recreated each render and reads only refs, the stable mutate and the router
  }, [status, s, studyId]); // eslint-disable-line react-hooks/exhaustive-deps

  const forecastDefaults = (): Record<string, unknown> => ({
    poolVolume: units === 'us' ? '15000 gal' : '57 m^3',
    startTemp: units === 'us' ? '68 degF' : '20 degC',
    targetTemp: units === 'us' ? '82 degF' : '28 degC',
    hours: 48,
    flow: units === 'us' ? '3 gpm' : '12 L/min',
    ...(fits.find((f) => f.coil) ? { fitId: fits.find((f) => f.coil)!.id } : { heater: { model: 'coil', sourceTemp: '90 degC', UA: '500 W/K' } }),
    losses: false,
  });

  const newData = (kind: Kind): Record<string, unknown> => {
    switch (kind) {
      case 'forecast':
        return forecastDefaults();
      case 'text':
        return { markdown: '' };
      case 'caution':
        return {};
      case 'costs':
        return costDefaults(units, [...s.blocks].reverse().find((b) => b.kind === 'forecast')?.id ?? null);
      case 'sensor-log':
        return logs[0] ? { sourceFileId: logs[0].id } : {};
      default:
        return fits[0] ? { fitId: fits[0].id } : {};
    }
  };

  return (
    <section className="card space-y-4 p-4" aria-label="Edit study">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 className="text-lg">Edit</h2>
        <span role="status" className={`text-sm ${status === 'conflict' || status === 'error' ? 'text-danger-text' : 'text-ink-muted'}`}>
          {status === 'saved' ? `Saved (revision ${s.revision})` : status === 'saving' ? 'Saving…' : status === 'pending' ? 'Unsaved changes…' : status === 'conflict' ? 'Edit conflict' : 'Not saved'}
        </span>
      </div>
      {message ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-sm text-danger-text">{message}</p> : null}
      {theirs ? (
        <div className="flex flex-wrap gap-2">
          <button
            type="button"
            className="btn-quiet"
            onClick={() => {
              setS({ title: theirs.title, blocks: theirs.blocks as Block[], revision: theirs.revision });
              setTheirs(null);
              setStatus('saved');
              setMessage(null);
              publish(theirs);
            }}
          >
            Take their version (drop mine)
          </button>
          <button
            type="button"
            className="btn-primary"
            onClick={() => {
              setS((mine) => ({ ...mine, revision: theirs.revision }));
              setTheirs(null);
              dirty.current = true;
              setStatus('pending');
            }}
          >
            Keep mine over theirs
          </button>
        </div>
      ) : null}
      <label className="block">
        <span className="field-label">Title</span>
        <input className="field-input" value={s.title} onChange={(e) => change({ title: e.target.value })} />
      </label>
      <ol className="space-y-3">
        {s.blocks.map((b, i) => (
          <li key={b.id} className="rounded-lg border border-paper-line p-3">
            <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
              <span className="text-sm font-semibold">
                {i + 1}. {label(b.kind)}
              </span>
              <span className="flex gap-1">
                <button type="button" className="btn-quiet px-2 py-1" aria-label={`Move block ${i + 1} up`} onClick={() => move(i, -1)}>
                  ↑
                </button>
                <button type="button" className="btn-quiet px-2 py-1" aria-label={`Move block ${i + 1} down`} onClick={() => move(i, 1)}>
                  ↓
                </button>
                <button type="button" className="btn-quiet px-2 py-1" aria-label={`Delete block ${i + 1}`} onClick={() => change({ blocks: s.blocks.filter((_, j) => j !== i) })}>
                  ✕
                </button>
              </span>
            </div>
            {b.kind === 'text' ? (
              <textarea aria-label={`Markdown of block ${i + 1}`} className="field-input font-mono text-sm" rows={5} value={String(b.data.markdown ?? '')} onChange={(e) => setData(i, { markdown: e.target.value })} />
            ) : b.kind === 'caution' ? (
              <input aria-label={`Extra caution of block ${i + 1}`} className="field-input" placeholder="A caution of your own (the standing ones are always shown)" value={String(b.data.text ?? '')} onChange={(e) => setData(i, { text: e.target.value })} />
            ) : b.kind === 'forecast' ? (
              <div className="grid gap-2 sm:grid-cols-3">
                {(['poolVolume', 'startTemp', 'targetTemp', 'flow'] as const).map((k) => (
                  <label key={k} className="text-sm">
                    <span className="field-label">{{ poolVolume: 'Pool volume', startTemp: 'Start', targetTemp: 'Target', flow: 'Pump flow' }[k]}</span>
                    <input className="field-input num" value={String(b.data[k] ?? '')} onChange={(e) => setData(i, { [k]: e.target.value })} />
                  </label>
                ))}
                <label className="text-sm">
                  <span className="field-label">Hours</span>
                  <input className="field-input num" value={String(b.data.hours ?? '')} onChange={(e) => setData(i, { hours: Number(e.target.value) || 0 })} />
                </label>
                <label className="text-sm">
                  <span className="field-label">Heater (coil fit)</span>
                  <select className="field-input" value={String(b.data.fitId ?? '')} onChange={(e) => setData(i, { fitId: e.target.value || undefined })}>
                    {fits.filter((f) => f.coil).map((f) => (
                      <option key={f.id} value={f.id}>
                        {f.label}
                      </option>
                    ))}
                    <option value="">Ts and UA given in the block</option>
                  </select>
                </label>
              </div>
            ) : b.kind === 'costs' ? (
              <CostSettings n={i + 1} data={b.data} set={(d) => setData(i, d)} units={units} forecasts={s.blocks.map((x, j) => ({ id: x.id, kind: x.kind, n: j + 1 })).filter((x) => x.kind === 'forecast')} />
            ) : b.kind === 'sensor-log' ? (
              <SensorLogSettings n={i + 1} data={b.data} set={(d) => setData(i, d)} logs={logs} />
            ) : (
              <select aria-label={`Saved fit of block ${i + 1}`} className="field-input" value={String(b.data.fitId ?? '')} onChange={(e) => setData(i, { fitId: e.target.value || undefined })}>
                <option value="">Choose a saved fit…</option>
                {fits.map((f) => (
                  <option key={f.id} value={f.id}>
                    {f.label}
                  </option>
                ))}
              </select>
            )}
          </li>
        ))}
      </ol>
      <div className="flex flex-wrap gap-2">
        {KINDS.map((k) => (
          <button
            key={k.kind}
            type="button"
            className="btn-quiet"
            onClick={() =>
              change({ blocks: [...s.blocks, { id: newId(), kind: k.kind, data: newData(k.kind) }] })
            }
          >
            + {k.label}
          </button>
        ))}
      </div>
    </section>
  );
}
