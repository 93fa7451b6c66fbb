import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { loadFile, saveLogMapping } from '@/app/_lib/imports/trial-sheets';
import { importJobDto } from '@/app/_lib/jobs/job-dto';
import { startSensorImport } from '@/app/_lib/jobs/sensor-import-job';
import { json, route } from '@/app/_lib/server/route';
import { logImportInput } from '@/app/_lib/imports/sensor-import';

/**
 * POST: import a stored sensor log in the background (mapping, preset and criteria edits, excluded
 * lines, optionally the accepted periods). Answers 202 with the job; poll GET /api/jobs/{id}. The
 * mapping is saved for the lab, to be offered again for a file with the same headers.
 */
export const POST = route<{ rigId: string; fileId: string }>({ auth: 'user', maxBodyBytes: 1024 * 1024 }, async (ctx) => {
  const { row: rig, member } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'trial:write');
  const file = await loadFile(ctx.em, rig, ctx.params.fileId);
  const input = await ctx.json(logImportInput);
  const job = await startSensorImport(ctx.em, rig, file, ctx.requireActor().user, input);
  // the engineer confirmed this mapping: offer it again when the same headers come back
  await saveLogMapping(ctx.em, member.lab, file, input.mapping);
  return json({ job: importJobDto(job) }, { status: 202 });
});
