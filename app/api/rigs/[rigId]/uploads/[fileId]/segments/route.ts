import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { loadFile } from '@/app/_lib/imports/trial-sheets';
import { route } from '@/app/_lib/server/route';
import { openLog, previewCriteria, previewStream, segmentPreviewInput } from '@/app/_lib/imports/sensor-preview';

/**
 * POST: read a stored sensor log whole, check its rows and find its steady periods with a preset
 * and edited thresholds (and measure the engineer's own periods). Nothing is saved. Answers a
 * stream of JSON lines: progress while the file is read, then the result (or an error). A bad
 * mapping, a threshold out of range or an unreadable file is refused with 422 before the stream
 * starts.
 */
export const POST = route<{ rigId: string; fileId: string }>({ auth: 'user', maxBodyBytes: 1024 * 1024 }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'trial:write');
  const file = await loadFile(ctx.em, rig, ctx.params.fileId);
  const input = await ctx.json(segmentPreviewInput);
  previewCriteria(input); // thresholds out of range: 422 before reading anything
  const opened = await openLog(file, input);
  return new Response(previewStream(opened, input, ctx.req.signal), {
    headers: { 'Content-Type': 'application/x-ndjson; charset=utf-8', 'Cache-Control': 'no-store', 'X-Accel-Buffering': 'no' },
  });
});
