import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { importJobDto } from '@/app/_lib/jobs/job-dto';
import { listRigJobs } from '@/app/_lib/jobs/job-store';
import { json, route } from '@/app/_lib/server/route';

/** GET: the rig's ten latest background imports with their state and progress (members of its lab). */
export const GET = route<{ rigId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'lab:read');
  return json({ jobs: (await listRigJobs(ctx.em, rig)).map(importJobDto) });
});
