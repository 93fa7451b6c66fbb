'use client';

import { useState } from 'react';
import { api, ApiError } from '../_components/api';
import type { TokenDto as Token } from '../_contracts/dto';


const when = (iso: string | null) => (iso ? new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' }) + ' UTC' : '—');

export function TokenManager({ labs, initial }: { labs: { id: string; name: string }[]; initial: Token[] }) {
  const [tokens, setTokens] = useState(initial);
  const [secret, setSecret] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const labName = (id: string) => labs.find((l) => l.id === id)?.name ?? 'another lab';
  return (
    <div className="mt-4 space-y-4">
      <form
        className="flex flex-wrap items-end gap-3"
        onSubmit={async (e) => {
          e.preventDefault();
          const form = e.currentTarget;
          const data = Object.fromEntries(new FormData(form).entries());
          setError(null);
          try {
            const r = await api<{ token: Token; secret: string }>('/api/tokens', { body: data });
            setTokens([r.token, ...tokens]);
            setSecret(r.secret);
            form.reset();
          } catch (err) {
            setError(err instanceof ApiError ? err.message : 'The server could not be reached.');
          }
        }}
      >
        <label className="min-w-[12rem] max-w-full flex-1">
          <span className="field-label">Token name</span>
          <input name="name" className="field-input" placeholder="e.g. yard logger" required />
        </label>
        <label className="min-w-[9rem] max-w-full">
          <span className="field-label">Expires after</span>
          <select name="expiresInDays" className="field-input" defaultValue="90">
            <option value="7">7 days</option>
            <option value="30">30 days</option>
            <option value="90">90 days</option>
            <option value="180">180 days</option>
            <option value="365">a year</option>
          </select>
        </label>
        <label className="min-w-[12rem] max-w-full">
          <span className="field-label">Your password</span>
          <input name="password" type="password" autoComplete="current-password" className="field-input" required />
        </label>
        <label className="min-w-[12rem] max-w-full">
          <span className="field-label">Lab</span>
          <select name="labId" className="field-input">
            {labs.map((l) => (
              <option key={l.id} value={l.id}>
                {l.name}
              </option>
            ))}
          </select>
        </label>
        <button className="btn-primary" type="submit">
          Create token
        </button>
      </form>
      {error ? <p role="alert" className="text-sm text-danger-text">{error}</p> : null}
      {secret ? (
        <div role="status" className="rounded-lg border border-caution-line bg-caution-bg p-3 text-sm text-caution-text">
          <p className="font-semibold">Copy this token now — it will not be shown again.</p>
          <p className="num mt-1 break-all text-ink" data-testid="new-token">{secret}</p>
        </div>
      ) : null}
      <div className="relative overflow-x-auto" tabIndex={0}>
        <table className="data-table">
          <thead>
            <tr>
              <th scope="col">Name</th>
              <th scope="col">Token</th>
              <th scope="col">Lab</th>
              <th scope="col">Last used</th>
              <th scope="col">Expires</th>
              <th scope="col">State</th>
              <th scope="col"><span className="sr-only">Actions</span></th>
            </tr>
          </thead>
          <tbody>
            {tokens.map((t) => (
              <tr key={t.id}>
                <td>{t.name}</td>
                <td className="num">{t.prefix}…</td>
                <td>{labName(t.labId)}</td>
                <td className="num">{when(t.lastUsedAt)}</td>
                <td className="num">{when(t.expiresAt)}</td>
                <td>
                  {t.revokedAt ? (
                    <span className="text-ink-muted">revoked</span>
                  ) : new Date(t.expiresAt) <= new Date() ? (
                    <span className="text-ink-muted">expired</span>
                  ) : (
                    <span className="text-ok-text">active</span>
                  )}
                </td>
                <td className="text-right">
                  {t.revokedAt ? null : (
                    <button
                      type="button"
                      className="btn-quiet"
                      onClick={async () => {
                        const r = await api<{ token: Token }>(`/api/tokens/${t.id}`, { method: 'DELETE' });
                        setTokens(tokens.map((x) => (x.id === t.id ? r.token : x)));
                      }}
                    >
                      Revoke
                    </button>
                  )}
                </td>
              </tr>
            ))}
            {tokens.length === 0 ? (
              <tr>
                <td colSpan={6} className="text-ink-muted">No tokens yet.</td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
    </div>
  );
}
