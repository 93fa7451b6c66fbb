import { defineConfig } from '@mikro-orm/postgresql';
import { Migrator } from '@mikro-orm/migrations';
import { entities } from './entities';
import { migrationsList } from './entities/migrations';
import { databaseUrl } from './app/_lib/server/database-url';

/**
 * The one MikroORM configuration, used by the app, the scripts and the CLI.
 * The URL is DATABASE_URL (app/_lib/server/database-url.ts), set by scripts/start.mjs and
 * scripts/test.mjs for the private cluster, or by the operator in production; it is read when the
 * ORM starts, not when this file is loaded (`next build` loads it without a database). Migrations are listed
 * statically so that they can run from inside the Next bundle and from vitest; `schema:update` is
 * never used at run time.
 */
const config = defineConfig({
  entities,
  extensions: [Migrator],
  discovery: { disableDynamicFileAccess: true, requireEntitiesArray: true },
  forceUtcTimezone: true,
  serialization: { forceObject: true },
  pool: { min: 0, max: Number(process.env.DATABASE_POOL_MAX ?? 10) },
  debug: process.env.MIKRO_ORM_DEBUG === 'true',
  // sensor_sample is no entity (written by COPY, read by SQL, keyed by a BRIN index): the schema
  // check leaves it to its migrations
  schemaGenerator: { skipTables: ['sensor_sample'] },
  migrations: {
    tableName: 'mikro_orm_migrations',
    path: './entities/migrations',
    pathTs: './entities/migrations',
    migrationsList,
    transactional: true,
    allOrNothing: true,
    snapshot: false,
    emit: 'ts',
    fileName: (timestamp: string, name?: string) => `Migration${timestamp}${name ? '_' + name : ''}`,
  },
});

// a getter on the finished object (defineConfig copies its argument): MikroORM.init reads it
Object.defineProperty(config, 'clientUrl', { enumerable: true, get: () => databaseUrl() });

export default config;
