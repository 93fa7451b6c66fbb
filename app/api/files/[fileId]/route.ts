import { Readable } from 'node:stream';
import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { audit } from '@/app/_lib/labs/audit';
import { route } from '@/app/_lib/server/route';
import { getObjectStream } from '@/app/_lib/server/storage';

/** GET: a stored file exactly as uploaded (raw trial sheets, rig photos), for members of its lab. */
export const GET = route<{ fileId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: file } = await loadInLab(ctx, 'file', ctx.params.fileId, 'lab:read');
  const body = Readable.toWeb(await getObjectStream(file.storageKey)) as ReadableStream<Uint8Array>;
  const inline = file.purpose === 'photo';
  // raw files leaving the app are recorded; rig photos shown on pages are not
  if (!inline) await audit(ctx.em, { kind: 'file-downloaded', actor: ctx.requireActor().user, lab: file.lab.id, subject: file.filename, ip: ctx.ip });
  return new Response(body, {
    headers: {
      'Content-Type': inline ? file.contentType : 'application/octet-stream',
      'Content-Length': String(file.sizeBytes),
      'Content-Disposition': `${inline ? 'inline' : 'attachment'}; filename="${file.filename.replace(/["\\\r\n]/g, '_')}"`,
      'X-Content-Type-Options': 'nosniff',
      ETag: `"${file.sha256}"`,
    },
  });
});
