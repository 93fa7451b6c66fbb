'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { api, ApiError } from '../../_components/api';

const ROLES = ['owner', 'engineer', 'reviewer', 'viewer'] as const;

export function MemberRow({
  labId,
  member,
  manage,
  self,
}: {
  labId: string;
  member: { id: string; role: string; user: { name: string; email: string } };
  manage: boolean;
  self: boolean;
}) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const call = async (method: string, body?: unknown) => {
    setBusy(true);
    setError(null);
    try {
      await api(`/api/labs/${labId}/members/${member.id}`, { method, body });
      router.refresh();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <tr>
      <td>
        {member.user.name}
        {self ? <span className="ml-1 text-ink-muted">(you)</span> : null}
        {error ? <p role="alert" className="mt-1 text-sm text-danger-text">{error}</p> : null}
      </td>
      <td className="num">{member.user.email}</td>
      <td>
        {manage ? (
          <select
            aria-label={`Role of ${member.user.name}`}
            className="rounded-md border border-paper-line bg-white px-2 py-1"
            value={member.role}
            disabled={busy}
            onChange={(e) => call('PATCH', { role: e.target.value })}
          >
            {ROLES.map((r) => (
              <option key={r} value={r}>
                {r}
              </option>
            ))}
          </select>
        ) : (
          member.role
        )}
      </td>
      {manage ? (
        <td className="text-right">
          <button
            type="button"
            className="btn-quiet"
            disabled={busy}
            onClick={() => {
              if (window.confirm(`Remove ${member.user.name} from this lab?`)) void call('DELETE');
            }}
          >
            Remove
          </button>
        </td>
      ) : null}
    </tr>
  );
}
