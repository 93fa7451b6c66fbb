import 'server-only';
import { wrap } from '@mikro-orm/core';
import type { ImportJobRow } from '@/entities';
import type { ImportJobDto } from '@/app/_contracts/dto';

/**
 * The plain data of a background job that reaches the browser (the rig page, GET /api/jobs/{id},
 * GET /api/rigs/{id}/jobs; `app/_components/use-jobs.ts` reads it).
 *
 * Owns: which fields of an `import_job` row are shown, and the progress fraction. May import:
 * entities (types), @mikro-orm/core (`wrap`). Routes load the job with `loadInLab(ctx, 'job', …)`.
 */
export const importJobDto = (j: ImportJobRow): ImportJobDto => ({
  id: j.id,
  kind: 'sensor-import' as const,
  state: j.state,
  rigId: j.rig.id,
  fileId: j.sourceFile.id,
  filename: wrap(j.sourceFile).isInitialized() ? j.sourceFile.filename : null,
  progress: { bytesDone: j.bytesDone, bytesTotal: j.bytesTotal, rowsDone: j.rowsDone, fraction: j.bytesTotal > 0 ? Math.min(1, j.bytesDone / j.bytesTotal) : 0 },
  attempts: j.attempts,
  cancelRequested: j.cancelRequested,
  result: j.result ?? null,
  error: j.error ?? null,
  createdAt: j.createdAt.toISOString(),
  startedAt: j.startedAt?.toISOString() ?? null,
  finishedAt: j.finishedAt?.toISOString() ?? null,
});
