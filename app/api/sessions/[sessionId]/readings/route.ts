import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { trialDto } from '@/app/_lib/rigs/trials';
import { addReading, readingInput } from '@/app/_lib/sessions/readings';
import { sessionDto, sessionTrials } from '@/app/_lib/sessions/sessions';

/**
 * POST: a reading of a run, saved as a trial of the session through the one trial rule. The id is
 * the phone's: the same reading sent again answers 200 with the trial already saved (no duplicate);
 * a new one 201. A reading outside the run's prediction interval is kept and answered with `check.inside: false`.
 */
export const POST = route<{ sessionId: string }>({ auth: 'user' }, async (ctx) => {
  const { row } = await loadInLab(ctx, 'session', ctx.params.sessionId, 'trial:write');
  const input = await ctx.json(readingInput);
  const r = await addReading(ctx.em, row.id, input, ctx.actor?.via === 'token' ? 'api' : 'manual');
  const trials = await sessionTrials(ctx.em, r.session);
  return json({ trial: trialDto(r.trial), duplicate: r.duplicate, check: r.check, drift: r.drift, warnings: r.warnings ?? [], session: sessionDto(r.session, trials) }, { status: r.duplicate ? 200 : 201 });
});
