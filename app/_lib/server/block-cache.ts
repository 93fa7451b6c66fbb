import 'server-only';
import { createHash, randomUUID } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import { LruCache } from '@/analysis/fit/lru-cache';
import { SOFTWARE_VERSION } from './version';

/**
 * Study block data computed once and kept: in PostgreSQL (`block_cache`, shared by every app
 * instance) with an in-process LRU in front. A key names everything its value was computed from —
 * a saved fit by id and version (saved fits are immutable), the unit system, the software
 * version, and for blocks over mutable inputs what they read (a forecast's settings by hash, a
 * sensor log's overview by id and time) — so an entry never needs to be invalidated: a change of
 * input is a new key. Callers authorize the block's record before they ask (the key's ids come
 * from records loaded inside the reader's lab).
 */

/** Entries kept in this process (a fit block's data is about 60 KB; 200 of them ≈ 12 MB). */
export const BLOCK_CACHE_MEMORY_ENTRIES = 200;
/** The key column's width: longer keys are kept as their hash. */
const KEY_MAX = 400;

const g = globalThis as unknown as { __emberlineBlockCache?: LruCache<Promise<unknown>> };
const memory = () => (g.__emberlineBlockCache ??= new LruCache<Promise<unknown>>(BLOCK_CACHE_MEMORY_ENTRIES));

/** SHA-256 of a value's JSON, base64url (a forecast block's settings in its key). */
export const jsonHash = (v: unknown) => createHash('sha256').update(JSON.stringify(v) ?? 'undefined').digest('base64url');

/**
 * The key of an entry: its parts and the software version, joined with `|`.
 * @example blockCacheKey(['fit', fit.id, fit.version, 'si']) // 'fit|…|1|si|emberline 0.1.0'
 */
export function blockCacheKey(parts: readonly (string | number)[]): string {
  const key = [...parts, SOFTWARE_VERSION].join('|');
  return key.length <= KEY_MAX ? key : `sha256|${createHash('sha256').update(key).digest('base64url')}`;
}

/** What an entry belongs to: its lab, and its saved fit when it has one (entries go with them). */
export interface CacheOwner {
  labId: string;
  fitId?: string | null;
}

async function load<T>(em: EntityManager, key: string, owner: CacheOwner, compute: () => Promise<T>): Promise<T> {
  const conn = em.getConnection();
  const rows = await conn.execute<{ value: T }[]>('select value from block_cache where key = ?', [key]);
  if (rows.length) return rows[0].value;
  // as it will read back from jsonb, so a hit and a miss answer the same
  const value = JSON.parse(JSON.stringify(await compute())) as T;
  try {
    await conn.execute(
      'insert into block_cache (id, created_at, updated_at, key, lab_id, fit_id, value) values (?, now(), now(), ?, ?, ?, ?::jsonb) on conflict (key) do nothing',
      [randomUUID(), key, owner.labId, owner.fitId ?? null, JSON.stringify(value)],
    );
  } catch (e) {
    // the lab or fit went away meanwhile: the value is still right for this answer, only not kept
    console.error('block cache: an entry could not be kept:', e instanceof Error ? e.message : e);
  }
  return value;
}

/**
 * The value under `key`: from this process, else from `block_cache`, else computed (and kept in
 * both). Concurrent asks in one process share one computation; a failed computation is not kept.
 * The value must be plain JSON (it is stored as jsonb and read back as parsed JSON).
 */
export function cachedBlockData<T>(em: EntityManager, key: string, owner: CacheOwner, compute: () => Promise<T>): Promise<T> {
  const mem = memory();
  const pending = mem.get(key, () => load(em, key, owner, compute)) as Promise<T>;
  pending.catch(() => mem.delete(key));
  return pending;
}

/** Empties this process's part (tests; the database part needs no invalidation). */
export function forgetBlockCacheInProcess(): void {
  g.__emberlineBlockCache = undefined;
}
