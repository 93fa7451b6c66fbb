import 'server-only';
import { NextResponse } from 'next/server';
import { ZodError } from 'zod';
import { InputError } from '@/analysis/units/reading-input';
import { DomainError, HTTP_STATUS } from './errors';

/**
 * Maps any thrown value to the API's one JSON shape `{error, message, fields?, …}` with its status:
 * a DomainError by its kind; a ZodError, and an analysis InputError (input the analysis refused, in
 * the user's words, naming their field), as 422 with a message per field; anything else as a logged
 * generic 500. Used by the route wrapper only.
 */
export function errorResponse(e: unknown): NextResponse {
  if (e instanceof DomainError) {
    const headers: Record<string, string> = { 'Cache-Control': 'no-store' };
    if (typeof e.details.retryAfter === 'number') headers['Retry-After'] = String(e.details.retryAfter);
    return NextResponse.json({ error: e.code, message: e.message, ...e.details }, { status: HTTP_STATUS[e.kind], headers });
  }
  if (e instanceof InputError) {
    return NextResponse.json({ error: 'invalid', message: e.message, fields: { [e.field ?? '_']: e.message } }, { status: 422, headers: { 'Cache-Control': 'no-store' } });
  }
  if (e instanceof ZodError) {
    const fields: Record<string, string> = {};
    for (const issue of e.issues) fields[issue.path.join('.') || '_'] ??= issue.message;
    return NextResponse.json({ error: 'invalid', message: 'Some fields are not valid.', fields }, { status: 422, headers: { 'Cache-Control': 'no-store' } });
  }
  console.error(e);
  return NextResponse.json({ error: 'internal', message: 'Something went wrong on our side. Nothing was changed.' }, { status: 500, headers: { 'Cache-Control': 'no-store' } });
}
