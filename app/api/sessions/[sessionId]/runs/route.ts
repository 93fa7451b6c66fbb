import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { json, route } from '@/app/_lib/server/route';
import { changeRuns, runChange, sessionDto, sessionTrials } from '@/app/_lib/sessions/sessions';

/** POST: adapt the plan — `{action: "skip" | "reopen" | "repeat", runKey}` or `{action: "add", flow}`. */
export const POST = route<{ sessionId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: s } = await loadInLab(ctx, 'session', ctx.params.sessionId, 'trial:write');
  const change = await ctx.json(runChange);
  await changeRuns(ctx.em, s, change);
  return json({ session: sessionDto(s, await sessionTrials(ctx.em, s)) });
});
