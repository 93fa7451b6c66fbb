'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api } from './api';

/** The lab switcher in the header: changes the current lab and re-renders the page. */
export function LabSwitcher({ labs, currentId }: { labs: { id: string; name: string; role: string }[]; currentId: string | null }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  if (!labs.length) return null;
  return (
    <label className="flex items-center gap-2 text-paper-deep max-md:mb-1 max-md:w-full">
      <span className="sr-only">Current lab</span>
      <select
        className="w-full rounded-md border md:w-auto md:max-w-[14rem] border-coal-line bg-coal-raised px-2 py-1.5 text-sm text-white"
        value={currentId ?? ''}
        disabled={busy}
        onChange={async (e) => {
          const labId = e.target.value;
          if (labId === '__new') {
            router.push('/labs/new');
            return;
          }
          setBusy(true);
          try {
            await api('/api/labs/current', { body: { labId } });
            router.refresh();
          } finally {
            setBusy(false);
          }
        }}
      >
        {labs.map((l) => (
          <option key={l.id} value={l.id}>
            {l.name} · {l.role}
          </option>
        ))}
        <option value="__new">＋ New lab…</option>
      </select>
    </label>
  );
}

export function SignOutButton({ everywhere = false, className = '' }: { everywhere?: boolean; className?: string }) {
  const router = useRouter();
  return (
    <button
      type="button"
      className={className || 'rounded-md px-2 py-1.5 text-left text-sm text-paper-deep hover:bg-coal-raised hover:text-white'}
      onClick={async () => {
        await api(everywhere ? '/api/auth/sign-out-everywhere' : '/api/auth/sign-out', { body: {} });
        router.push('/sign-in');
        router.refresh();
      }}
    >
      {everywhere ? 'Sign out everywhere' : 'Sign out'}
    </button>
  );
}
