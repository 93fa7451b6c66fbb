import 'server-only';
import { NextResponse } from 'next/server';
import { ZodError } from 'zod';

/** An expected failure with an HTTP status and a public message. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly extra: Record<string, unknown> = {},
    readonly headers: Record<string, string> = {},
  ) {
    super(message);
  }
}
export const unauthorized = (message = 'Sign in to continue.') => new HttpError(401, 'unauthorized', message);
export const forbidden = (message = 'Your role in this lab does not allow this.') => new HttpError(403, 'forbidden', message);
export const notFound = (message = 'Not found.') => new HttpError(404, 'not_found', message);
export const badRequest = (message: string, extra?: Record<string, unknown>) => new HttpError(400, 'bad_request', message, extra);
export const conflict = (message: string) => new HttpError(409, 'conflict', message);

/** Maps any thrown value to a JSON response; unknown errors are logged and become a generic 500. */
export function errorResponse(e: unknown): NextResponse {
  if (e instanceof HttpError) {
    return NextResponse.json({ error: e.code, message: e.message, ...e.extra }, { status: e.status, headers: e.headers });
  }
  if (e instanceof ZodError) {
    const fields: Record<string, string> = {};
    for (const issue of e.issues) fields[issue.path.join('.') || '_'] ??= issue.message;
    return NextResponse.json({ error: 'invalid', message: 'Some fields are not valid.', fields }, { status: 422 });
  }
  console.error(e);
  return NextResponse.json({ error: 'internal', message: 'Something went wrong on our side. Nothing was changed.' }, { status: 500 });
}
