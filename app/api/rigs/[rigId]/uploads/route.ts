import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { maxUploadBytes, sourceFileDto, storeUpload } from '@/app/_lib/imports/trial-sheets';
import { json, route } from '@/app/_lib/server/route';
import { badRequest } from '@/app/_lib/server/errors';

/** POST: the raw file as the request body (`?filename=`); stored unchanged with its SHA-256. */
export const POST = route<{ rigId: string }>({ auth: 'user', maxBodyBytes: maxUploadBytes() }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'trial:write');
  const filename = ctx.req.nextUrl.searchParams.get('filename')?.trim();
  if (!filename) throw badRequest('Name the file: ?filename=trials.csv');
  const { file, duplicate } = await storeUpload(ctx.em, rig, ctx.requireActor().user, ctx.bodyStream(), filename, ctx.req.headers.get('content-type') ?? 'application/octet-stream');
  return json({ file: sourceFileDto(file), duplicate }, { status: duplicate ? 200 : 201 });
});
