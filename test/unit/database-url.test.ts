/**
 * The one database URL (app/_lib/server/database-url.ts) and the three pools that take it: the
 * ORM's (mikro-orm.config.ts), the plain `pg` pool of the import (server/pg-pool.ts) and pg-boss's
 * (jobs/queue.ts). Common practice: a service takes its database from one setting and refuses to
 * guess one (a guessed default once sent the import to port 54329 whatever EMBERLINE_PG_PORT said).
 * Nothing here connects: pools and pg-boss connect on first use.
 */
import { afterEach, describe, expect, test } from 'vitest';
import config from '../../mikro-orm.config';
import { databaseUrl } from '../../app/_lib/server/database-url';
import { pgPool } from '../../app/_lib/server/pg-pool';
import { newBoss } from '../../app/_lib/jobs/queue';

const saved = process.env.DATABASE_URL;
const url = 'postgres://emberline:pw@127.0.0.1:54348/emberline';
const g = globalThis as typeof globalThis & { __emberlinePgPool?: { end(): Promise<void> } };

afterEach(async () => {
  if (saved === undefined) delete process.env.DATABASE_URL;
  else process.env.DATABASE_URL = saved;
  await g.__emberlinePgPool?.end();
  g.__emberlinePgPool = undefined;
});

describe('every pool connects to DATABASE_URL and to nothing guessed', () => {
  test('the URL is DATABASE_URL as given', () => {
    expect(databaseUrl({ DATABASE_URL: url, EMBERLINE_PG_PORT: '54348' })).toBe(url);
  });

  test('without DATABASE_URL each pool refuses with one clear message instead of a default port', () => {
    delete process.env.DATABASE_URL;
    expect(() => databaseUrl({ EMBERLINE_PG_PORT: '54348' })).toThrow(/DATABASE_URL is not set/);
    expect(() => pgPool()).toThrow(/DATABASE_URL is not set/);
    expect(() => newBoss()).toThrow(/DATABASE_URL is not set/);
    expect(() => config.clientUrl).toThrow(/DATABASE_URL is not set/);
  });

  test('the ORM reads the URL when it starts, not when its configuration is loaded', () => {
    process.env.DATABASE_URL = url;
    expect(config.clientUrl).toBe(url);
    expect(Object.entries(config).find(([k]) => k === 'clientUrl')?.[1]).toBe(url); // what MikroORM.init merges
    process.env.DATABASE_URL = url.replace('54348', '54350');
    expect(config.clientUrl).toMatch(/:54350\//);
  });

  test('the import pool takes it (the same pool for every caller)', () => {
    process.env.DATABASE_URL = url;
    const pool = pgPool() as unknown as { options: { connectionString: string } };
    expect(pool.options.connectionString).toBe(url);
    expect(pgPool()).toBe(pool);
  });
});
