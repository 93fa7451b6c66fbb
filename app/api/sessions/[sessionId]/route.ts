import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { sessionDto, sessionTrials } from '@/app/_lib/sessions/sessions';

/** GET: a session with its plan, runs, trials and (when closed) its verdict. */
export const GET = route<{ sessionId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: s } = await loadInLab(ctx, 'session', ctx.params.sessionId, 'lab:read');
  return json({ session: sessionDto(s, await sessionTrials(ctx.em, s)) });
});
