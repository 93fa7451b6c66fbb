import { config } from '@/app/_lib/server/config';
import { notFound } from '@/app/_lib/server/errors';
import { labMail } from '@/app/_lib/mail/lab-mail';
import { json, route } from '@/app/_lib/server/route';

/** GET: messages captured by the local SMTP fake (demo mode, owners only). */
export const GET = route<{ labId: string }>({ auth: 'session', labAction: 'mail:read' }, async (ctx) => {
  if (!config.demo) throw notFound();
  return json({ messages: await labMail(ctx.params.labId) });
});
