import { AuditEvent } from '@/entities';
import { auditDto } from '@/app/_lib/server/dto';
import { json, route } from '@/app/_lib/server/route';

/** GET: the lab's security events, newest first (owners). */
export const GET = route<{ labId: string }>({ auth: 'session', labAction: 'audit:read' }, async (ctx) => {
  const rows = await ctx.em.find(AuditEvent, { lab: ctx.params.labId }, { populate: ['actor'], orderBy: { createdAt: 'desc' }, limit: 200 });
  return json({ events: rows.map(auditDto) });
});
