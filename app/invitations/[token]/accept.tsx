'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api, ApiError } from '../../_components/api';

export function AcceptInvitation({ token }: { token: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <div>
      <button
        type="button"
        className="btn-primary"
        disabled={busy}
        onClick={async () => {
          setBusy(true);
          setError(null);
          try {
            await api(`/api/invitations/${encodeURIComponent(token)}`, { body: {} });
            router.push('/rigs');
            router.refresh();
          } catch (e) {
            setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
            setBusy(false);
          }
        }}
      >
        Accept and join
      </button>
      {error ? (
        <p role="alert" className="mt-3 text-sm text-danger-text">
          {error}
        </p>
      ) : null}
    </div>
  );
}
