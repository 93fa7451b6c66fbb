import { defineConfig } from '@mikro-orm/postgresql';
import { Migrator } from '@mikro-orm/migrations';
import { entities } from './entities';
import { migrationsList } from './entities/migrations';

/**
 * The one MikroORM configuration, used by the app, the scripts and the CLI.
 * DATABASE_URL is set by scripts/start.mjs and scripts/test.mjs for the private cluster, or by
 * the operator in production. Migrations are listed statically so that they can run from inside
 * the Next bundle and from vitest; `schema:update` is never used at run time.
 */
export default defineConfig({
  clientUrl: process.env.DATABASE_URL ?? 'postgres://emberline@127.0.0.1:54329/emberline',
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
