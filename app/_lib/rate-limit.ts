import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { HttpError } from './errors';

export interface Limit {
  /** e.g. "sign-in:ip:203.0.113.9" */
  key: string;
  max: number;
  windowS: number;
}

/**
 * Counts one attempt against each limit in PostgreSQL (one atomic upsert per key, so the limit
 * holds across instances) and throws 429 with Retry-After when any is exceeded.
 */
export async function enforceLimits(em: EntityManager, limits: Limit[]): Promise<void> {
  for (const l of limits) await hitLimit(em, l);
}

function tooMany(resetAt: Date): HttpError {
  const retryAfter = Math.max(1, Math.ceil((new Date(resetAt).getTime() - Date.now()) / 1000));
  const minutes = Math.ceil(retryAfter / 60);
  return new HttpError(
    429,
    'rate_limited',
    `Too many attempts. Wait ${minutes} minute${minutes === 1 ? '' : 's'} and try again.`,
    { retryAfter },
    { 'Retry-After': String(retryAfter) },
  );
}

/** Throws 429 when the key is already at its limit, without counting this attempt. */
export async function checkLimit(em: EntityManager, l: Limit): Promise<void> {
  const rows = await em.getConnection().execute<{ count: number; reset_at: Date }[]>(
    'select count, reset_at from rate_limit where key = ? and reset_at > now()',
    [l.key],
  );
  if (rows[0] && rows[0].count >= l.max) throw tooMany(rows[0].reset_at);
}

/** Counts one attempt against the key and throws 429 past the limit. */
export async function hitLimit(em: EntityManager, l: Limit): Promise<void> {
  const conn = em.getConnection();
  {
    const rows = await conn.execute<{ count: number; reset_at: Date }[]>(
      `insert into rate_limit (key, count, reset_at) values (?, 1, now() + make_interval(secs => ?))
       on conflict (key) do update set
         count = case when rate_limit.reset_at <= now() then 1 else rate_limit.count + 1 end,
         reset_at = case when rate_limit.reset_at <= now() then excluded.reset_at else rate_limit.reset_at end
       returning count, reset_at`,
      [l.key, l.windowS],
    );
    const { count, reset_at } = rows[0];
    if (count > l.max) throw tooMany(reset_at);
  }
}
