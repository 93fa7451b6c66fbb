import 'server-only';
import { z } from 'zod';
import { Rig, type RigRow } from '@/entities';
import { HEAT_SOURCES } from '@/entities/rig';
import { conflict, notFound } from '../server/errors';
import type { Action } from '../labs/permissions';
import type { Member, RouteContext } from '../server/route';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The fields of a rig as the API takes them, without defaults (so that a patch leaves out what it does not name). */
const rigFields = z.object({
  name: z.string().trim().min(1, 'Give the rig a name.').max(120),
  heatSource: z.enum(HEAT_SOURCES),
  description: z.string().trim().max(4000),
  notes: z.string().trim().max(20000),
  details: z
    .object({
      coilLengthM: z.number().positive().max(1000).optional(),
      tubeInnerDiameterM: z.number().positive().max(1).optional(),
      tubeMaterial: z.string().max(80).optional(),
      collectorAreaM2: z.number().positive().max(10000).optional(),
      burnerRatingW: z.number().positive().max(1e7).optional(),
    })
    .strict(),
});
/** A new rig: what it leaves out starts empty. */
export const rigInput = rigFields.extend({
  description: rigFields.shape.description.default(''),
  notes: rigFields.shape.notes.default(''),
  details: rigFields.shape.details.default({}),
});
/**
 * An edit: only the fields it names change. Built from the fields without defaults — a default
 * survives `.partial()` in zod and would blank every field the edit leaves out.
 */
export const rigPatch = rigFields.partial();

/** Loads a rig and checks the caller's role in its lab: 404 for non-members and unknown ids alike. */
export async function loadRig<P>(ctx: RouteContext<P>, rigId: string, action: Action): Promise<{ rig: RigRow; member: Member }> {
  ctx.requireActor();
  if (!UUID.test(rigId)) throw notFound();
  const rig = await ctx.em.findOne(Rig, { id: rigId });
  if (!rig) throw notFound();
  const member = await ctx.requireMember(rig.lab.id, action);
  return { rig, member };
}

export async function createRig(ctx: RouteContext<{ labId: string }>, input: z.infer<typeof rigInput>): Promise<RigRow> {
  const lab = ctx.member!.lab;
  if (await ctx.em.findOne(Rig, { lab, name: input.name })) throw conflict(`This lab already has a rig called "${input.name}".`);
  const rig = ctx.em.create(Rig, { lab, ...input });
  await ctx.em.flush();
  return rig;
}

export async function updateRig(ctx: RouteContext<unknown>, rig: RigRow, patch: z.infer<typeof rigPatch>): Promise<RigRow> {
  if (patch.name && patch.name !== rig.name && (await ctx.em.findOne(Rig, { lab: rig.lab, name: patch.name }))) {
    throw conflict(`This lab already has a rig called "${patch.name}".`);
  }
  ctx.em.assign(rig, patch);
  await ctx.em.flush();
  return rig;
}

export { UUID };
