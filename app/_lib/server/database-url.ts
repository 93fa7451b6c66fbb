/**
 * The database's connection URL, defined once: `DATABASE_URL`. `npm start`, `npm test` and the
 * benchmarks always set it (the private cluster's URL, with its port `EMBERLINE_PG_PORT` and its
 * password); in production the operator does. There is no fallback: a guessed URL would miss the
 * private cluster's port and password and fail later with a less clear message.
 *
 * Owns: reading DATABASE_URL. May import: nothing. It has no `import 'server-only'` because
 * mikro-orm.config.ts (loaded by the MikroORM CLI and scripts/setup-db.ts, outside Next) reads it
 * too; its users are the three pools: MikroORM's, the plain `pg` pool (pg-pool.ts) and pg-boss's.
 */
export function databaseUrl(env: Record<string, string | undefined> = process.env): string {
  const url = env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: start the app with `npm start` or `npm test`, or set it to the PostgreSQL URL');
  return url;
}
