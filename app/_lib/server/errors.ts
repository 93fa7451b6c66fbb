/**
 * The one error model. Everything in `app/_lib` (and the import and cost code below it) reports an
 * expected failure by throwing a `DomainError`: what kind of failure it is, a stable code for
 * programs, a message in words for the person, and details (`fields` by field name, `retryAfter`
 * in seconds, …). It is mapped to HTTP once, in the route wrapper (`errorResponse` in
 * `error-response.ts`), and to `{ ok: false }` once for server actions (`actionResult`). Nothing here
 * knows about HTTP or Next.js, so any module may throw these.
 */
export type ErrorKind =
  | 'bad_request' | 'unauthorized' | 'forbidden' | 'not_found' | 'conflict' | 'gone' | 'too_large' | 'invalid' | 'rate_limited' | 'cancelled' | 'unavailable';

export class DomainError extends Error {
  constructor(
    readonly kind: ErrorKind,
    readonly code: string,
    message: string,
    /** extra public data: `fields` (field → message), `retryAfter` (s), `issues`, `current`… */
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

export const badRequest = (message: string, code = 'bad_request', details?: Record<string, unknown>) => new DomainError('bad_request', code, message, details);
export const unauthorized = (message = 'Sign in to continue.', code = 'unauthorized') => new DomainError('unauthorized', code, message);
export const forbidden = (message = 'Your role in this lab does not allow this.', code = 'forbidden') => new DomainError('forbidden', code, message);
export const notFound = (message = 'Not found.') => new DomainError('not_found', 'not_found', message);
export const conflict = (message: string, code = 'conflict', details?: Record<string, unknown>) => new DomainError('conflict', code, message, details);
/** A link or token that no longer works (used, expired, withdrawn). */
export const gone = (code: string, message: string) => new DomainError('gone', code, message);
export const tooLarge = (message: string, code = 'too_large') => new DomainError('too_large', code, message);
/** Input that is well-formed but not acceptable; `fields` names each field the person can fix. */
export const invalid = (message: string, fields?: Record<string, string>, code = 'invalid', details?: Record<string, unknown>) =>
  new DomainError('invalid', code, message, { ...(fields ? { fields } : {}), ...details });
export const rateLimited = (retryAfterS: number, message: string) => new DomainError('rate_limited', 'rate_limited', message, { retryAfter: retryAfterS });
export const cancelled = (message: string) => new DomainError('cancelled', 'cancelled', message);
/** The server cannot take this work now (a full analysis queue); `retryAfter` says when to ask again. */
export const unavailable = (message: string, retryAfterS: number, code = 'unavailable') => new DomainError('unavailable', code, message, { retryAfter: retryAfterS });

/** The HTTP status of each kind (the only place that knows it). */
export const HTTP_STATUS: Record<ErrorKind, number> = {
  bad_request: 400, unauthorized: 401, forbidden: 403, not_found: 404, conflict: 409, gone: 410, too_large: 413, invalid: 422,
  rate_limited: 429, cancelled: 499, unavailable: 503,
};

/** What a server action returns for a failure: `{ ok: false, error, message, fields? }` (unknown errors are rethrown). */
export function actionResult(e: unknown): { ok: false; error: string; message: string; fields?: Record<string, string> } {
  if (e instanceof DomainError) {
    const fields = e.details.fields as Record<string, string> | undefined;
    return { ok: false, error: e.code, message: e.message, ...(fields ? { fields } : {}) };
  }
  throw e;
}
