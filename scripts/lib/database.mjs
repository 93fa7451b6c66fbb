// Database-level chores through `pg` (available after npm ci).
import { fail } from './util.mjs';

function withDb(url, db) {
  const u = new URL(url);
  u.pathname = `/${db}`;
  return u.toString();
}

async function connect(url) {
  const { default: pg } = await import('pg');
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 10_000 });
  try {
    await client.connect();
  } catch (e) {
    const where = new URL(url);
    fail(`the database at ${where.hostname}:${where.port || 5432} refused the connection (${e.message}); check DATABASE_URL or the cluster`);
  }
  return client;
}

const ident = (name) => {
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) fail(`invalid database name "${name}"`);
  return `"${name}"`;
};

/** Creates the database named in `url` when it does not exist (connecting to `postgres`). */
export async function ensureDatabase(url, { fresh = false } = {}) {
  const name = new URL(url).pathname.slice(1);
  const client = await connect(withDb(url, 'postgres'));
  try {
    if (fresh) await client.query(`DROP DATABASE IF EXISTS ${ident(name)} WITH (FORCE)`);
    const { rowCount } = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]);
    if (!rowCount) await client.query(`CREATE DATABASE ${ident(name)}`);
  } finally {
    await client.end();
  }
}

/** Checks that a database accepts connections (the production path with DATABASE_URL). */
export async function checkDatabase(url) {
  const client = await connect(url);
  await client.end();
}
