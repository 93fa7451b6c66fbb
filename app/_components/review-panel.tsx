'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api, ApiError } from './api';

export const STATE_LABEL: Record<string, string> = { draft: 'Draft', 'in-review': 'In review', approved: 'Approved', 'changes-requested': 'Changes requested' };
export const STATE_CLASS: Record<string, string> = {
  draft: 'bg-paper-deep text-ink-soft',
  'in-review': 'bg-water-50 text-water-800',
  approved: 'bg-ok-bg text-ok-text',
  'changes-requested': 'bg-caution-bg text-caution-text',
};

export function StateBadge({ state }: { state: string }) {
  return <span className={`rounded-full px-2.5 py-0.5 text-xs font-semibold ${STATE_CLASS[state]}`}>{STATE_LABEL[state] ?? state}</span>;
}

/** Review state, actions by role, comments and history of a fit or study. */
export function ReviewPanel(props: {
  /** a comparison takes comments only (no review decisions) */
  kind: 'fit' | 'study' | 'comparison';
  id: string;
  state: string;
  canSubmit: boolean;
  canDecide: boolean;
  /** the viewer made or (a study) edited this since the last decision: someone else decides */
  ownWork?: boolean;
  canComment: boolean;
  comments: { id: string; at: string; by: string | null; body: string; blockId: string | null }[];
  events: { at: string; by: string | null; from: string; to: string; note: string }[];
}) {
  const router = useRouter();
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | null>(null);
  const base = props.kind === 'fit' ? `/api/fits/${props.id}` : props.kind === 'comparison' ? `/api/comparisons/${props.id}` : `/api/studies/${props.id}`;
  const act = async (url: string, body: unknown) => {
    setError(null);
    try {
      await api(url, { body });
      setNote('');
      router.refresh();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    }
  };
  const s = props.state;
  return (
    <aside className="card h-fit space-y-4 p-4" aria-label={props.kind === 'comparison' ? 'Comments' : 'Review'}>
      <div className="flex items-center justify-between">
        <h2 className="text-lg">{props.kind === 'comparison' ? 'Comments' : 'Review'}</h2>
        {props.kind === 'comparison' ? null : <StateBadge state={s} />}
      </div>
      <div className="flex flex-wrap gap-2">
        {props.canSubmit && (s === 'draft' || s === 'changes-requested') ? (
          <button type="button" className="btn-primary" onClick={() => act(`${base}/review`, { move: 'submit', note })}>
            Ask for review
          </button>
        ) : null}
        {props.canDecide && s === 'in-review' && props.ownWork ? (
          <p className="text-sm text-ink-soft">You worked on this {props.kind}: another reviewer or owner approves or returns it.</p>
        ) : null}
        {props.canDecide && s === 'in-review' && !props.ownWork ? (
          <>
            <button type="button" className="btn-primary" onClick={() => act(`${base}/review`, { move: 'approve', note })}>
              Approve
            </button>
            <button type="button" className="btn-quiet" onClick={() => act(`${base}/review`, { move: 'request-changes', note })}>
              Request changes
            </button>
          </>
        ) : null}
      </div>
      {props.canComment ? (
        <div className="space-y-2">
          <label className="block">
            <span className="field-label">Comment</span>
            <textarea className="field-input" rows={3} value={note} onChange={(e) => setNote(e.target.value)} />
          </label>
          <button type="button" className="btn-quiet" disabled={!note.trim()} onClick={() => act(`${base}/comments`, { body: note })}>
            Add comment
          </button>
        </div>
      ) : null}
      {error ? <p role="alert" className="text-sm text-danger-text">{error}</p> : null}
      <ol className="space-y-3 text-sm">
        {[...props.comments.map((c) => ({ at: c.at, by: c.by, text: c.body, kind: 'comment' })), ...props.events.map((e) => ({ at: e.at, by: e.by, text: `${STATE_LABEL[e.from]} → ${STATE_LABEL[e.to]}${e.note ? `: ${e.note}` : ''}`, kind: 'event' }))]
          .sort((a, b) => a.at.localeCompare(b.at))
          .map((x, i) => (
            <li key={i} className={x.kind === 'event' ? 'text-ink-muted' : ''}>
              <span className="num text-xs text-ink-muted">{x.at.slice(0, 16).replace('T', ' ')}</span> <strong className="text-ink">{x.by ?? 'someone'}</strong>
              <p className="whitespace-pre-wrap">{x.text}</p>
            </li>
          ))}
      </ol>
    </aside>
  );
}
