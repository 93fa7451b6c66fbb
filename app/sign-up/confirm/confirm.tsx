'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api, ApiError } from '../../_components/api';
import { safeNextPath } from '../../_contracts/safe-next';

export function ConfirmSignUp({ token }: { token: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="space-y-4">
      {error ? (
        <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-sm text-danger-text">
          {error}
        </p>
      ) : null}
      <button
        type="button"
        className="btn-primary"
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          try {
            const r = await api<{ next?: string }>('/api/auth/sign-up/confirm', { body: { token } });
            router.push(safeNextPath(r.next, window.location.origin, '/rigs'));
            router.refresh();
          } catch (e) {
            setError(e instanceof ApiError ? e.message : 'The server could not be reached. Check your connection and try again.');
            setBusy(false);
          }
        }}
      >
        {busy ? 'Working…' : 'Create my account'}
      </button>
    </div>
  );
}
