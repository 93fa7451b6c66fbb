import 'server-only';
import { hostname } from 'node:os';
import pg from 'pg';
import { databaseUrl } from './database-url';

/**
 * The process's one plain `pg` pool, for the SQL the ORM does not do: the sensor-log import's
 * transaction and binary COPY, the import_job store's conditional updates, and the overview
 * backfill's COPY out. MikroORM keeps its own pool (mikro-orm.config.ts) and pg-boss its own
 * (jobs/queue.ts); all three connect to the one URL of database-url.ts.
 *
 * Its connections name the process (`application_name` "emberline <host> <pid>", PostgreSQL keeps
 * 63 bytes), so that `pg_stat_activity` tells which instance runs which import or holds which lock.
 *
 * Owns: the pool, created on first use and cached on globalThis (hot reload keeps it).
 * May import: `pg`, ./database-url.
 */
const g = globalThis as typeof globalThis & { __emberlinePgPool?: pg.Pool };

/** The pool (`IMPORT_POOL_MAX` connections, default 4); `end()` it only when the process is done with it. */
export function pgPool(): pg.Pool {
  if (!g.__emberlinePgPool) {
    g.__emberlinePgPool = new pg.Pool({ connectionString: databaseUrl(), max: Number(process.env.IMPORT_POOL_MAX ?? 4), application_name: processName() });
    g.__emberlinePgPool.on('error', (e) => console.error('pg pool:', e.message));
  }
  return g.__emberlinePgPool;
}

/** The name this process's connections carry: "emberline <host> <pid>", at most 63 bytes. */
export function processName(): string {
  return `emberline ${hostname().slice(0, 40)} ${process.pid}`;
}
