// The bootstrapping shared by `npm start` and `npm test`: packages, database, migrations, demo data.
import path from 'node:path';
import { root, runVisible, step } from './util.mjs';
import { ensureNodeModules } from './install.mjs';
import { startCluster } from './postgres.mjs';

/**
 * @param {{ database: string, fresh?: boolean, demo: boolean }} opts  database name for the private cluster; demo:
 *   load the demo lab (its accounts have a published password: never in a production database)
 * @returns {Promise<{ databaseUrl: string, stop: () => void, external: boolean }>}
 */
export async function bootstrap({ database, fresh = false, demo }) {
  ensureNodeModules();
  const { ensureDatabase, checkDatabase } = await import('./database.mjs');
  let databaseUrl;
  let stop = () => {};
  const external = Boolean(process.env.DATABASE_URL);
  if (external) {
    databaseUrl = process.env.DATABASE_URL;
    step('using the PostgreSQL at DATABASE_URL (no private cluster)');
    if (fresh) {
      const u = new URL(databaseUrl);
      u.pathname = `/${database}`;
      databaseUrl = u.toString();
      await ensureDatabase(databaseUrl, { fresh });
    } else {
      await checkDatabase(databaseUrl);
    }
  } else {
    const cluster = await startCluster();
    stop = () => cluster.stop();
    databaseUrl = cluster.url(database);
    try {
      await ensureDatabase(databaseUrl, { fresh });
    } catch (e) {
      stop();
      throw e;
    }
  }
  try {
    step(`${fresh ? `fresh database "${database}": ` : ''}migrations${demo ? ' and demo lab' : ''}`);
    runVisible(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'scripts/setup-db.ts')], 'migrations or demo data failed (see above); the database was left as the last complete migration', {
      // react-server: the demo seed saves its fits and imports its log with app/_lib, whose modules start with `import 'server-only'`
      env: { ...process.env, DATABASE_URL: databaseUrl, EMBERLINE_DEMO: demo ? 'true' : 'false', NODE_OPTIONS: `${process.env.NODE_OPTIONS ?? ''} --conditions=react-server`.trim() },
    });
  } catch (e) {
    stop();
    throw e;
  }
  return { databaseUrl, stop, external };
}
