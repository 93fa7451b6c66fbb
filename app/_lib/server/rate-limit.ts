import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { rateLimited, type DomainError } from './errors';

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

export function tooMany(resetAt: Date, message?: string): DomainError {
  const retryAfter = Math.max(1, Math.ceil((new Date(resetAt).getTime() - Date.now()) / 1000));
  const wait = retryAfter < 90 ? `${retryAfter} second${retryAfter === 1 ? '' : 's'}` : `${Math.ceil(retryAfter / 60)} minutes`;
  return rateLimited(retryAfter, message ?? `Too many attempts. Wait ${wait} and try again.`);
}

/** The attempts counted against the key in its current window (0 when none), without counting this one. */
export async function attempts(em: EntityManager, key: string): Promise<{ count: number; resetAt: Date | null }> {
  const rows = await em.getConnection().execute<{ count: number; reset_at: Date }[]>(
    'select count, reset_at from rate_limit where key = ? and reset_at > now()',
    [key],
  );
  return rows[0] ? { count: rows[0].count, resetAt: rows[0].reset_at } : { count: 0, resetAt: null };
}

/** Throws 429 when the key is already at its limit, without counting this attempt. */
export async function checkLimit(em: EntityManager, l: Limit): Promise<void> {
  const a = await attempts(em, l.key);
  if (a.resetAt && a.count >= l.max) throw tooMany(a.resetAt);
}

/** Counts one attempt against the key (a new window when the last one ended) and returns the count. */
export async function countAttempt(em: EntityManager, l: Limit): Promise<number> {
  return (await countAttemptAt(em, l)).count;
}

async function countAttemptAt(em: EntityManager, l: Limit): Promise<{ count: number; resetAt: Date }> {
  const rows = await em.getConnection().execute<{ count: number; reset_at: Date }[]>(
    `insert into rate_limit (key, count, reset_at) values (?, 1, now() + make_interval(secs => ?))
     on conflict (key) do update set
       count = case when rate_limit.reset_at <= now() then 1 else rate_limit.count + 1 end,
       reset_at = case when rate_limit.reset_at <= now() then excluded.reset_at else rate_limit.reset_at end
     returning count, reset_at`,
    [l.key, l.windowS],
  );
  return { count: rows[0].count, resetAt: rows[0].reset_at };
}

/** Counts one attempt against the key and throws 429 past the limit. */
export async function hitLimit(em: EntityManager, l: Limit): Promise<void> {
  const { count, resetAt } = await countAttemptAt(em, l);
  if (count > l.max) throw tooMany(resetAt);
}

/** Forgets the attempts counted against a key (e.g. the failures of an account after it signs in). */
export async function clearLimit(em: EntityManager, key: string): Promise<void> {
  await em.getConnection().execute('delete from rate_limit where key = ?', [key]);
}
