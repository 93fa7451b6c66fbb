'use client';

import { useRouter } from 'next/navigation';
import { useState, type ReactNode } from 'react';
import { api, ApiError } from './api';
import { safeNextPath } from '../_contracts/safe-next';

/**
 * One button that posts to an API route and then goes on: to the answer's `next` (a path of our
 * own origin) or to `then`. The server's message is shown beside it when it refuses.
 */
export function PostButton({ url, body = {}, then, children }: { url: string; body?: unknown; then: string; children: ReactNode }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <div className="space-y-3">
      <button
        type="button"
        className="btn-primary"
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          try {
            const r = await api<{ next?: string }>(url, { body });
            router.push(safeNextPath(r.next, window.location.origin, then));
            router.refresh();
          } catch (e) {
            setError(e instanceof ApiError ? e.message : 'The server could not be reached. Check your connection and try again.');
            setBusy(false);
          }
        }}
      >
        {busy ? 'Working…' : children}
      </button>
      {error ? (
        <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-sm text-danger-text">
          {error}
        </p>
      ) : null}
    </div>
  );
}
