/**
 * A worker-only process: the background-job workers (today the sensor-log import,
 * app/_lib/jobs/) without a web server, for a deployment that keeps imports off its web
 * instances (run those with EMBERLINE_JOB_WORKER=off). Same settings as a web instance
 * (DATABASE_URL, the S3_* object store); any number of them may run, pg-boss gives each job to one.
 *
 *   NODE_OPTIONS=--conditions=react-server npx tsx scripts/worker.ts
 *
 * (`npm start -- --instances N --worker` starts one beside the web instances.) SIGTERM or SIGINT
 * stops taking jobs and waits up to 30 s for the running one; a job cut short is picked up again by
 * another worker when its lease runs out (app/_lib/jobs/job-store.ts).
 */
import { startJobWorkers } from '@/app/_lib/jobs/sensor-import-job';
import { getBoss } from '@/app/_lib/jobs/queue';

async function main() {
  await startJobWorkers();
  console.log(`job worker ${process.pid} is taking jobs`);
  let stopping = false;
  for (const signal of ['SIGTERM', 'SIGINT'] as const) {
    process.on(signal, () => {
      if (stopping) return;
      stopping = true;
      void (async () => {
        await (await getBoss()).stop({ graceful: true, wait: true, timeout: 30_000 }).catch(() => undefined);
        process.exit(0);
      })();
    });
  }
}

main().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
});
