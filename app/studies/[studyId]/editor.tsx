'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useRef, useState } from 'react';
import { api, ApiError } from '../../_components/api';

type Kind = 'text' | 'trials' | 'fit' | 'comparison' | 'performance' | 'forecast' | 'caution';
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
  { kind: 'caution', label: 'Caution box' },
];
const label = (k: Kind) => KINDS.find((x) => x.kind === k)?.label ?? k;
const newId = () => Math.random().toString(36).slice(2, 10);

/**
 * Edits a study's blocks and saves automatically against the revision it loaded. When someone
 * else saved in between, nothing is overwritten: the conflict is shown with a choice.
 */
export function StudyEditor({ studyId, initial, fits, units }: { studyId: string; initial: StudyState; fits: { id: string; label: string; coil: boolean }[]; units: 'si' | 'us' }) {
  const router = useRouter();
  const [s, setS] = useState<StudyState>(initial);
  const [status, setStatus] = useState<'saved' | 'pending' | 'saving' | 'conflict' | 'error'>('saved');
  const [message, setMessage] = useState<string | null>(null);
  const [theirs, setTheirs] = useState<StudyState | null>(null);
  const dirty = useRef(false);

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
        const r = await api<{ study: StudyState }>(`/api/studies/${studyId}`, { method: 'PUT', body: { title: s.title, blocks: s.blocks, baseRevision: s.revision } });
        setS((old) => ({ ...old, revision: r.study.revision }));
        setStatus(dirty.current ? 'pending' : 'saved');
        setMessage(null);
        router.refresh();
      } catch (e) {
        if (e instanceof ApiError && e.status === 409 && e.body.current) {
          setTheirs(e.body.current as StudyState);
          setStatus('conflict');
          setMessage(e.message);
        } else {
          setStatus('error');
          setMessage(e instanceof ApiError ? e.message : 'Not saved: the server could not be reached. Your edits stay here; they save when it answers.');
          dirty.current = true;
        }
      }
    }, 800);
    return () => clearTimeout(t);
  }, [status, s, studyId, router]);

  const forecastDefaults = (): Record<string, unknown> => ({
    poolVolume: units === 'us' ? '15000 gal' : '57 m^3',
    startTemp: units === 'us' ? '68 degF' : '20 degC',
    targetTemp: units === 'us' ? '82 degF' : '28 degC',
    hours: 48,
    flow: units === 'us' ? '3 gpm' : '12 L/min',
    ...(fits.find((f) => f.coil) ? { fitId: fits.find((f) => f.coil)!.id } : { heater: { model: 'coil', sourceTemp: '90 degC', UA: '500 W/K' } }),
    losses: false,
  });

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
              setS(theirs);
              setTheirs(null);
              setStatus('saved');
              setMessage(null);
              router.refresh();
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
              change({ blocks: [...s.blocks, { id: newId(), kind: k.kind, data: k.kind === 'forecast' ? forecastDefaults() : k.kind === 'text' ? { markdown: '' } : fits[0] && k.kind !== 'caution' ? { fitId: fits[0].id } : {} }] })
            }
          >
            + {k.label}
          </button>
        ))}
      </div>
    </section>
  );
}
