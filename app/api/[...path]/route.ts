import { config } from '@/app/_lib/config';
import { errorResponse, notFound } from '@/app/_lib/errors';
import { setSecurityHeaders } from '@/app/_lib/security-headers';

/**
 * Any /api path that no route answers: a JSON 404 with the API's headers. Without it Next.js
 * would answer with the HTML not-found page, which gets no headers from proxy.ts (it leaves /api
 * out). Nothing is read: the request body, if any, is never taken in.
 */
function missing(): Response {
  const res = errorResponse(notFound('There is no such API route.'));
  res.headers.set('Cache-Control', 'no-store');
  setSecurityHeaders(res.headers, config.appUrl);
  return res;
}

export const GET = missing;
export const POST = missing;
export const PUT = missing;
export const PATCH = missing;
export const DELETE = missing;
