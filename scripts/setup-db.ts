/**
 * Applies pending migrations (each in its own transaction, all or nothing) and, in demo mode only
 * (EMBERLINE_DEMO=true), loads the demo lab when it is not there yet: its accounts have a
 * published password, so a production database never gets them. Run by scripts/start.mjs and
 * scripts/test.mjs with DATABASE_URL set.
 */
import { MikroORM } from '@mikro-orm/postgresql';
import config from '../mikro-orm.config';

async function main() {
  const orm = await MikroORM.init(config);
  try {
    const applied = await orm.getMigrator().up();
    console.log(applied.length ? `  applied ${applied.length} migration(s): ${applied.map((m) => m.name).join(', ')}` : '  migrations current');
    if (process.env.EMBERLINE_DEMO !== 'true') {
      console.log('  not in demo mode: no demo lab');
      return;
    }
    // loaded only in demo mode: the seed uses app/_lib, which needs `--conditions=react-server` (scripts/lib/bootstrap.mjs)
    // a one-shot script: the seed's fits and comparisons run in this thread, not in a worker pool that would outlive it
    process.env.EMBERLINE_ANALYSIS_THREADS ??= '0';
    const { seedDemoLab } = await import('./seed');
    const seeded = await seedDemoLab(orm.em.fork());
    console.log(seeded ? '  demo lab loaded' : '  demo lab already present');
  } finally {
    await orm.close(true);
  }
}

main().catch((e) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
