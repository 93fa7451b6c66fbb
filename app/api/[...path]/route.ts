import type { NextRequest } from 'next/server';
import { notFound } from '@/app/_lib/server/errors';
import { route } from '@/app/_lib/server/route';

/**
 * Any /api path that no route answers: a JSON 404 through the route wrapper (its headers, its
 * origin check, its audit of refusals). Without it Next.js would answer with the HTML not-found
 * page, which gets no headers from proxy.ts (it leaves /api out). No body is read.
 */
const refuse = route({ auth: 'public' }, async () => {
  throw notFound('There is no such API route.');
});
const missing = (req: NextRequest) => refuse(req, { params: Promise.resolve({}) });

export const GET = missing;
export const POST = missing;
export const PUT = missing;
export const PATCH = missing;
export const DELETE = missing;
