import { SourceFile } from '@/entities';
import { HttpError, badRequest } from '@/app/_lib/server/errors';
import { sourceFileDto } from '@/app/_lib/imports/trial-sheets';
import { loadRig } from '@/app/_lib/rigs/rigs';
import { json, route } from '@/app/_lib/server/route';
import { putFile, spool } from '@/app/_lib/server/storage';

const MAX_PHOTO_BYTES = 15 * 1024 * 1024;
const IMAGE_TYPES = new Set(['image/jpeg', 'image/png', 'image/webp']);

/** Magic numbers of the accepted formats: the declared type must match the bytes. */
function sniff(head: Buffer): string | null {
  if (head[0] === 0xff && head[1] === 0xd8 && head[2] === 0xff) return 'image/jpeg';
  if (head.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'image/png';
  if (head.subarray(0, 4).toString('latin1') === 'RIFF' && head.subarray(8, 12).toString('latin1') === 'WEBP') return 'image/webp';
  return null;
}

/** GET: the rig's photos. */
export const GET = route<{ rigId: string }>({ auth: 'user' }, async (ctx) => {
  const { rig } = await loadRig(ctx, ctx.params.rigId, 'lab:read');
  const photos = await ctx.em.find(SourceFile, { rig, purpose: 'photo' }, { orderBy: { createdAt: 'desc' } });
  return json({ photos: photos.map(sourceFileDto) });
});

/** POST: a photo of the rig as the raw request body (JPEG, PNG or WebP, ≤ 15 MB, `?filename=`). */
export const POST = route<{ rigId: string }>({ auth: 'user', maxBodyBytes: MAX_PHOTO_BYTES }, async (ctx) => {
  const { rig } = await loadRig(ctx, ctx.params.rigId, 'rig:write');
  const filename = ctx.req.nextUrl.searchParams.get('filename')?.trim() || 'photo';
  const type = (ctx.req.headers.get('content-type') ?? '').split(';')[0].trim();
  if (!IMAGE_TYPES.has(type)) throw badRequest('Send a JPEG, PNG or WebP picture.');
  const spooled = await spool(ctx.bodyStream(), MAX_PHOTO_BYTES);
  try {
    const { readFile } = await import('node:fs/promises');
    const head = (await readFile(spooled.file)).subarray(0, 16);
    if (sniff(head) !== type) throw new HttpError(422, 'not_image', `"${filename}" is not a ${type.split('/')[1].toUpperCase()} picture.`);
    const existing = await ctx.em.findOne(SourceFile, { lab: rig.lab, sha256: spooled.sha256, purpose: 'photo' });
    if (existing) return json({ photo: sourceFileDto(existing), duplicate: true });
    const storageKey = await putFile(spooled, rig.lab.id, type);
    const photo = ctx.em.create(SourceFile, { lab: rig.lab, rig, uploadedBy: ctx.requireActor().user, purpose: 'photo', filename: filename.slice(0, 255), contentType: type, sizeBytes: spooled.sizeBytes, sha256: spooled.sha256, storageKey });
    await ctx.em.flush();
    return json({ photo: sourceFileDto(photo), duplicate: false }, { status: 201 });
  } finally {
    await spooled.cleanup();
  }
});
