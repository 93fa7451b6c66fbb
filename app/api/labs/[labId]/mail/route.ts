import { config } from '@/app/_lib/config';
import { notFound } from '@/app/_lib/errors';
import { labMail } from '@/app/_lib/lab-mail';
import { json, route } from '@/app/_lib/route';

/** GET: messages captured by the local SMTP fake (demo mode, owners only). */
export const GET = route<{ labId: string }>({ auth: 'session', labAction: 'mail:read' }, async (ctx) => {
  if (!config.demo) throw notFound();
  return json({ messages: await labMail(ctx.params.labId) });
});
