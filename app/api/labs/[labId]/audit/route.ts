import { auditOf } from '@/app/_lib/labs/labs';
import { auditDto } from '@/app/_lib/server/dto';
import { json, route } from '@/app/_lib/server/route';

/** GET: the lab's security events, newest first (owners). */
export const GET = route<{ labId: string }>({ auth: 'session', labAction: 'audit:read' }, async (ctx) => {
  const rows = await auditOf(ctx.em, ctx.params.labId);
  return json({ events: rows.map(auditDto) });
});
