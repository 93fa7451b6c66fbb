import 'server-only';
import { Fit, type FitRow } from '@/entities';
import { notFound } from '../server/errors';
import type { Action } from '../labs/permissions';
import type { Member, RouteContext } from '../server/route';
import { UUID } from '../rigs/rigs';

/** Loads a saved fit and checks the caller's role in its lab (404 for everyone outside it). */
export async function loadFit(ctx: RouteContext<{ fitId: string }>, action: Action): Promise<{ fit: FitRow; member: Member }> {
  ctx.requireActor();
  if (!UUID.test(ctx.params.fitId)) throw notFound();
  const fit = await ctx.em.findOne(Fit, { id: ctx.params.fitId }, { populate: ['createdBy'] });
  if (!fit) throw notFound();
  return { fit, member: await ctx.requireMember(fit.lab.id, action) };
}
