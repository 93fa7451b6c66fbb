import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { route } from '@/app/_lib/server/route';
import { sessionEventStream } from '@/app/_lib/sessions/events';

/** GET: server-sent events of a session — its progress, the live steady-state signal and the last minutes of samples (`?once=1`: one snapshot). */
export const GET = route<{ sessionId: string }>({ auth: 'user' }, async (ctx) => {
  const { row } = await loadInLab(ctx, 'session', ctx.params.sessionId, 'lab:read');
  return sessionEventStream(row.id, ctx.req.signal, ctx.req.nextUrl.searchParams.get('once') === '1');
});
