'use client';

import { useState } from 'react';
import { api, ApiError } from '../../_components/api';

interface Share {
  id: string;
  createdAt: string;
  expiresAt: string;
  revokedAt: string | null;
}

/** Read-only share links: with an expiry, shown once, revocable. */
export function ShareManager({ studyId, initial }: { studyId: string; initial: Share[] }) {
  const [shares, setShares] = useState(initial);
  const [url, setUrl] = useState<string | null>(null);
  const [days, setDays] = useState(30);
  const [error, setError] = useState<string | null>(null);
  return (
    <section className="card space-y-3 p-4" aria-label="Share">
      <h2 className="text-lg">Share</h2>
      <p className="text-sm text-ink-soft">Anyone with the link reads this study without signing in; it shows no member names and no raw files.</p>
      <div className="flex items-end gap-2">
        <label className="text-sm">
          <span className="field-label">Valid for (days)</span>
          <input className="field-input num w-24" type="number" min={1} max={365} value={days} onChange={(e) => setDays(Number(e.target.value))} />
        </label>
        <button
          type="button"
          className="btn-primary"
          onClick={async () => {
            setError(null);
            try {
              const r = await api<{ share: Share; url: string }>(`/api/studies/${studyId}/shares`, { body: { days } });
              setShares([r.share, ...shares]);
              setUrl(r.url);
            } catch (e) {
              setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
            }
          }}
        >
          Create link
        </button>
      </div>
      {error ? <p role="alert" className="text-sm text-danger-text">{error}</p> : null}
      {url ? (
        <p className="rounded-lg border border-caution-line bg-caution-bg p-2 text-sm text-caution-text">
          Copy it now, it is shown once: <span className="num break-all text-ink" data-testid="share-url">{url}</span>
        </p>
      ) : null}
      <ul className="space-y-1 text-sm">
        {shares.map((s) => (
          <li key={s.id} className="flex items-center justify-between gap-2">
            <span className="num text-xs">
              until {s.expiresAt.slice(0, 10)} {s.revokedAt ? '· revoked' : ''}
            </span>
            {s.revokedAt ? null : (
              <button
                type="button"
                className="btn-quiet px-2 py-1"
                onClick={async () => {
                  const r = await api<{ share: Share }>(`/api/shares/${s.id}`, { method: 'DELETE' });
                  setShares(shares.map((x) => (x.id === s.id ? r.share : x)));
                }}
              >
                Revoke
              </button>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
