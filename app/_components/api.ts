'use client';

/** The one client fetcher: JSON in and out, throws ApiError on any non-2xx with the server's message. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields: Record<string, string> = {},
    readonly body: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

export async function api<T = Record<string, unknown>>(url: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  const res = await fetch(url, {
    method: init.method ?? (init.body === undefined ? 'GET' : 'POST'),
    headers: init.body === undefined ? {} : { 'Content-Type': 'application/json' },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
    credentials: 'same-origin',
  });
  let body: Record<string, unknown> = {};
  try {
    body = await res.json();
  } catch {
    /* no JSON body */
  }
  if (!res.ok) {
    throw new ApiError(res.status, String(body.message ?? `Request failed (${res.status}).`), (body.fields as Record<string, string>) ?? {}, body);
  }
  return body as T;
}

/** SWR fetcher sharing the same error policy. */
export const fetcher = <T,>(url: string) => api<T>(url);

/**
 * What a form shows for a failed request: the server's message and per-field messages, or that
 * the server could not be reached.
 */
export function failureOf(err: unknown): { message: string; fields: Record<string, string> } {
  return err instanceof ApiError ? { message: err.message, fields: err.fields } : { message: 'The server could not be reached.', fields: {} };
}
