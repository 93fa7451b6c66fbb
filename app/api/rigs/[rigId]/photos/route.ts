import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { sourceFileDto } from '@/app/_lib/imports/trial-sheets';
import { MAX_PHOTO_BYTES, checkPhotoType, rigPhotos, savePhoto } from '@/app/_lib/rigs/photos';
import { json, route } from '@/app/_lib/server/route';
import { spool } from '@/app/_lib/server/storage';

/** GET: the rig's photos. */
export const GET = route<{ rigId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'lab:read');
  return json({ photos: (await rigPhotos(ctx.em, rig)).map(sourceFileDto) });
});

/** POST: a photo of the rig as the raw request body (JPEG, PNG or WebP, ≤ 15 MB, `?filename=`). */
export const POST = route<{ rigId: string }>({ auth: 'user', maxBodyBytes: MAX_PHOTO_BYTES }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'rig:write');
  const filename = ctx.req.nextUrl.searchParams.get('filename')?.trim() || 'photo';
  const type = (ctx.req.headers.get('content-type') ?? '').split(';')[0].trim();
  checkPhotoType(type);
  const spooled = await spool(ctx.bodyStream(), MAX_PHOTO_BYTES);
  try {
    const { photo, duplicate } = await savePhoto(ctx.em, rig, ctx.requireActor().user, spooled, filename, type);
    return json({ photo: sourceFileDto(photo), duplicate }, { status: duplicate ? 200 : 201 });
  } finally {
    await spooled.cleanup();
  }
});
