'use client';

import { useRouter } from 'next/navigation';
import { useId, useState, useSyncExternalStore, type ReactNode } from 'react';
import { api, ApiError } from './api';
import { safeNextPath } from '../_contracts/safe-next';

/** Hydration has no event to subscribe to: the server snapshot says false, the client's true. */
const noSubscribe = () => () => undefined;

export interface Field {
  name: string;
  label: string;
  type?: 'text' | 'email' | 'password' | 'select' | 'hidden' | 'checkbox';
  autoComplete?: string;
  hint?: string;
  value?: string;
  options?: { value: string; label: string }[];
  required?: boolean;
}

/**
 * A small form that posts JSON to one of our API routes and shows the server's per-field
 * messages beside the fields. On success it redirects, refreshes, or shows a message.
 */
export function JsonForm({
  action,
  method = 'POST',
  fields,
  submitLabel,
  onSuccess = { refresh: true },
  children,
  className = '',
}: {
  action: string;
  method?: string;
  fields: Field[];
  submitLabel: string;
  onSuccess?: { redirect?: string; refresh?: boolean; message?: string; reset?: boolean };
  children?: (result: Record<string, unknown> | null) => ReactNode;
  className?: string;
}) {
  const router = useRouter();
  const id = useId();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [done, setDone] = useState<string | null>(null);
  const [result, setResult] = useState<Record<string, unknown> | null>(null);
  // Until React has hydrated, the button stays disabled: a native submit must never put a
  // password into the URL.
  const ready = useSyncExternalStore(noSubscribe, () => true, () => false);

  async function submit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const data = Object.fromEntries(new FormData(form).entries());
    setBusy(true);
    setError(null);
    setFieldErrors({});
    setDone(null);
    try {
      const body = await api(action, { method, body: data });
      setResult(body);
      if (onSuccess.reset) form.reset();
      if (onSuccess.message) setDone(String(body.message ?? onSuccess.message));
      if (onSuccess.redirect) {
        const next = new URLSearchParams(window.location.search).get('next');
        router.push(safeNextPath(next, window.location.origin, onSuccess.redirect));
      }
      if (onSuccess.refresh) router.refresh();
    } catch (err) {
      if (err instanceof ApiError) {
        setError(err.message);
        setFieldErrors(err.fields);
      } else setError('The server could not be reached. Check your connection and try again.');
    } finally {
      setBusy(false);
    }
  }

  return (
    <form method="post" onSubmit={submit} className={`space-y-4 ${className}`} noValidate aria-describedby={error ? `${id}-error` : undefined}>
      {fields.map((f) =>
        f.type === 'hidden' ? (
          <input key={f.name} type="hidden" name={f.name} value={f.value ?? ''} />
        ) : f.type === 'checkbox' ? (
          <label key={f.name} className="flex items-center gap-2 text-sm text-ink-soft">
            <input type="checkbox" name={f.name} defaultChecked={f.value === 'on'} className="h-4 w-4" />
            {f.label}
          </label>
        ) : (
          <div key={f.name}>
            <label htmlFor={`${id}-${f.name}`} className="field-label">
              {f.label}
            </label>
            {f.type === 'select' ? (
              <select id={`${id}-${f.name}`} name={f.name} defaultValue={f.value} className="field-input" aria-invalid={!!fieldErrors[f.name]}>
                {f.options?.map((o) => (
                  <option key={o.value} value={o.value}>
                    {o.label}
                  </option>
                ))}
              </select>
            ) : (
              <input
                id={`${id}-${f.name}`}
                name={f.name}
                type={f.type ?? 'text'}
                defaultValue={f.value}
                autoComplete={f.autoComplete}
                required={f.required ?? true}
                className="field-input"
                aria-invalid={!!fieldErrors[f.name]}
                aria-describedby={fieldErrors[f.name] ? `${id}-${f.name}-err` : f.hint ? `${id}-${f.name}-hint` : undefined}
              />
            )}
            {f.hint && !fieldErrors[f.name] ? (
              <p id={`${id}-${f.name}-hint`} className="mt-1 text-xs text-ink-muted">
                {f.hint}
              </p>
            ) : null}
            {fieldErrors[f.name] ? (
              <p id={`${id}-${f.name}-err`} className="mt-1 text-sm text-danger-text">
                {fieldErrors[f.name]}
              </p>
            ) : null}
          </div>
        ),
      )}
      {error ? (
        <p id={`${id}-error`} role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-sm text-danger-text">
          {error}
        </p>
      ) : null}
      {done ? (
        <p role="status" className="rounded-lg bg-ok-bg px-3 py-2 text-sm text-ok-text">
          {done}
        </p>
      ) : null}
      <button type="submit" className="btn-primary" disabled={busy || !ready}>
        {busy ? 'Working…' : submitLabel}
      </button>
      {children?.(result)}
    </form>
  );
}
