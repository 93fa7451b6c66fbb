/**
 * Runs once when a Next.js server starts: the background-job workers start with the web server
 * (Node runtime only). EMBERLINE_JOB_WORKER=off starts a web process without them.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== 'nodejs' || process.env.EMBERLINE_JOB_WORKER === 'off') return;
  const { startJobWorkers } = await import('./app/_lib/jobs');
  startJobWorkers().catch((e: unknown) => console.error('background jobs did not start:', e instanceof Error ? e.message : e));
}
