import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { z } from 'zod';
import { json, route } from '@/app/_lib/server/route';
import { createTrials, listQuery, listTrials, trialDto, trialInput } from '@/app/_lib/rigs/trials';

type P = { rigId: string };

/** GET: the rig's trials, paginated, sorted and filtered on the server. */
export const GET = route<P>({ auth: 'user' }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'lab:read');
  const q = listQuery.parse(Object.fromEntries(ctx.req.nextUrl.searchParams));
  const r = await listTrials(ctx.em, rig, q);
  return json({ trials: r.rows.map(trialDto), total: r.total, page: r.page, pageSize: r.pageSize, hottest: r.hottest });
});

const batch = z.object({ trials: z.array(trialInput).min(1, 'Send at least one trial.').max(1000, 'Send at most 1,000 trials at once.') }).strict();

/** POST: add one trial or `{ trials: [...] }` (up to 1,000) in one transaction — all or none — checked by the one trial rule. */
export const POST = route<P>({ auth: 'user', maxBodyBytes: 1024 * 1024 }, async (ctx) => {
  const { row: rig } = await loadInLab(ctx, 'rig', ctx.params.rigId, 'trial:write');
  const raw = await ctx.json(z.unknown());
  const many = !!raw && typeof raw === 'object' && 'trials' in raw;
  const trials = many ? batch.parse(raw).trials : [trialInput.parse(raw)];
  const { rows, warnings } = await createTrials(ctx.em, rig, trials, ctx.actor?.via === 'token' ? 'api' : 'manual', many);
  return json({ trials: rows.map(trialDto), warnings }, { status: 201 });
});
