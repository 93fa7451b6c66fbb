import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { importJobDto } from '@/app/_lib/jobs/job-dto';
import { cancelSensorImport } from '@/app/_lib/jobs/sensor-import-job';
import { json, route } from '@/app/_lib/server/route';

/** GET: a background job's state, progress and result (members of its lab only). */
export const GET = route<{ jobId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: job } = await loadInLab(ctx, 'job', ctx.params.jobId, 'lab:read');
  return json({ job: importJobDto(job) });
});

/** DELETE: cancel the job; a running import stops between two batches and is rolled back (409 once it has ended). */
export const DELETE = route<{ jobId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: job } = await loadInLab(ctx, 'job', ctx.params.jobId, 'trial:write');
  return json({ job: importJobDto(await cancelSensorImport(ctx.em, job)) });
});
