/**
 * Runs once when a Next.js server starts (Node runtime only): a production server whose
 * configuration is unsafe refuses to start, with one clear message per problem (APP_URL missing,
 * SESSION_SECRET too short…; app/_lib/server/startup.ts); the analysis worker threads start loading
 * (app/_lib/server/analysis-pool.ts); then the background-job workers start with the
 * web server (EMBERLINE_JOB_WORKER=off starts a web process without them).
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  (await import('./app/_lib/server/startup')).refuseUnsafeStart();
  // the analysis threads load their code while the server starts, not at the first fit
  (await import('./app/_lib/server/analysis-pool')).warmAnalysisPool();
  if (process.env.EMBERLINE_JOB_WORKER === 'off') return;
  const { startJobWorkers } = await import('./app/_lib/jobs/sensor-import-job');
  startJobWorkers().catch((e: unknown) => console.error('background jobs did not start:', e instanceof Error ? e.message : e));
}
