'use client';

import type { UnitSystem } from '@/analysis/units/unit-system';
import { BlockItem } from './block-item';
import { KINDS, newBlockData, newBlockId, type StudyState } from './study-blocks-model';
import { useStudyAutosave } from './use-study-autosave';

/**
 * Edits a study's blocks and saves automatically against the revision it loaded. When someone
 * else saved in between, nothing is overwritten: the conflict is shown with a choice. After a save
 * the study's SWR entry takes the saved version and only the blocks whose settings changed fetch
 * their data again (use-study-autosave.ts).
 */
export function StudyEditor({ studyId, initial, initialReviewState, fits, logs, comparisons = [], plans = [], units }: {
  studyId: string;
  initial: StudyState;
  initialReviewState: string;
  fits: { id: string; label: string; coil: boolean; collector?: boolean }[];
  logs: { id: string; label: string }[];
  comparisons?: { id: string; label: string }[];
  plans?: { id: string; label: string }[];
  units: UnitSystem;
}) {
  const { study: s, status, message, theirs, change, takeTheirs, keepMine } = useStudyAutosave(studyId, initial, initialReviewState);
  const setData = (i: number, d: Record<string, unknown>) => change({ blocks: s.blocks.map((x, j) => (j === i ? { ...x, data: { ...x.data, ...d } } : x)) });
  const move = (i: number, by: number) => {
    const j = i + by;
    if (j < 0 || j >= s.blocks.length) return;
    const blocks = [...s.blocks];
    [blocks[i], blocks[j]] = [blocks[j], blocks[i]];
    change({ blocks });
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
          <button type="button" className="btn-quiet" onClick={takeTheirs}>
            Take their version (drop mine)
          </button>
          <button type="button" className="btn-primary" onClick={keepMine}>
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
          <BlockItem key={b.id} block={b} i={i} blocks={s.blocks} units={units} choices={{ fits, logs, comparisons, plans }} setData={(d) => setData(i, d)} move={(by) => move(i, by)} remove={() => change({ blocks: s.blocks.filter((_, j) => j !== i) })} />
        ))}
      </ol>
      <div className="flex flex-wrap gap-2">
        {KINDS.map((k) => (
          <button key={k.kind} type="button" className="btn-quiet" onClick={() => change({ blocks: [...s.blocks, { id: newBlockId(), kind: k.kind, data: newBlockData(k.kind, units, { fits, logs, comparisons, plans }, s.blocks) }] })}>
            + {k.label}
          </button>
        ))}
      </div>
    </section>
  );
}
