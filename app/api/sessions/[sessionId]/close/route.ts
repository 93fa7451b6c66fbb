import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { closeSession } from '@/app/_lib/sessions/close';
import { sessionDto, sessionTrials } from '@/app/_lib/sessions/sessions';

/** POST: close the session — the fit, lack of fit, drift verdict, standard errors against the plan, and the next best run. */
export const POST = route<{ sessionId: string }>({ auth: 'user' }, async (ctx) => {
  const { row } = await loadInLab(ctx, 'session', ctx.params.sessionId, 'trial:write');
  const s = await closeSession(ctx.em, row.id);
  return json({ session: sessionDto(s, await sessionTrials(ctx.em, s)) });
});
