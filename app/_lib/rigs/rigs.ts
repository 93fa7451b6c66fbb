import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Rig, SourceFile, type LabRow, type RigRow } from '@/entities';
import { HEAT_SOURCES } from '@/entities/rig';
import { conflict } from '../server/errors';
import type { RouteContext } from '../server/route';

/**
 * What a solar-collector rig records (SI; ISO 9806 states coefficients per gross or aperture area,
 * so a collector test needs one of them): areas, the plane's tilt from horizontal and azimuth
 * (degrees clockwise from north), the heat-transfer fluid (water unless its cp and density are
 * given) and the flow per unit area (m³/s per m² of gross area).
 */
export const collectorDetails = z.object({
  grossAreaM2: z.number({ error: 'the gross area must be a number of m²' }).positive({ error: 'the gross area must be more than 0 m²' }).max(10000, { error: 'the gross area is over 10,000 m²' }).optional(),
  apertureAreaM2: z.number({ error: 'the aperture area must be a number of m²' }).positive({ error: 'the aperture area must be more than 0 m²' }).max(10000, { error: 'the aperture area is over 10,000 m²' }).optional(),
  tiltDeg: z.number({ error: 'the tilt must be a number of degrees' }).min(0, { error: 'the tilt is from 0° (flat) to 90° (vertical)' }).max(90, { error: 'the tilt is from 0° (flat) to 90° (vertical)' }).optional(),
  azimuthDeg: z.number({ error: 'the azimuth must be a number of degrees' }).min(0, { error: 'the azimuth is from 0° to 360° (clockwise from north)' }).max(360, { error: 'the azimuth is from 0° to 360° (clockwise from north)' }).optional(),
  fluid: z.string().trim().max(80, { error: 'the fluid name is over 80 characters' }).optional(),
  fluidCpJPerKgK: z.number().min(1000, { error: 'the fluid cp is from 1,000 to 5,000 J/(kg·K)' }).max(5000, { error: 'the fluid cp is from 1,000 to 5,000 J/(kg·K)' }).optional(),
  fluidDensityKgPerM3: z.number().min(500, { error: 'the fluid density is from 500 to 2,000 kg/m³' }).max(2000, { error: 'the fluid density is from 500 to 2,000 kg/m³' }).optional(),
  flowPerAreaM3PerSM2: z.number().positive({ error: 'the flow per area must be more than 0' }).max(1e-3, { error: 'the flow per area is over 60 L/(min·m²)' }).optional(),
});
export type CollectorDetails = z.infer<typeof collectorDetails>;

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
      ...collectorDetails.shape,
      buildCost: z.number().positive().max(1e9).optional(),
      buildCostCurrency: z.string().trim().regex(/^[A-Z]{3}$/, 'a three-letter currency code such as USD').optional(),
    })
    .strict()
    .superRefine((d, ctx) => {
      if (d.grossAreaM2 !== undefined && d.apertureAreaM2 !== undefined && d.apertureAreaM2 > d.grossAreaM2) {
        ctx.addIssue({ code: 'custom', path: ['apertureAreaM2'], message: `the aperture area (${d.apertureAreaM2} m²) cannot be larger than the gross area (${d.grossAreaM2} m²)` });
      }
    }),
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


/** A lab's rigs by name, with the number of included trials of each (one grouped count). */
export async function rigsOfLab(em: EntityManager, lab: LabRow): Promise<{ rigs: RigRow[]; counts: Map<string, number> }> {
  const rigs = await em.find(Rig, { lab }, { orderBy: { name: 'asc' } });
  const rows = await em.getConnection().execute<{ rig_id: string; n: number }[]>(
    'select rig_id, count(*)::int as n from trial where lab_id = ? and excluded = false group by rig_id',
    [lab.id],
  );
  return { rigs, counts: new Map(rigs.map((r) => [r.id, rows.find((x) => x.rig_id === r.id)?.n ?? 0])) };
}

/** The rig page's files: the latest trial sheets and the photos. */
export async function rigFiles(em: EntityManager, rig: RigRow) {
  // a test session's logger samples are a source file with no stored object (storage key `session:<id>`): the session page shows them
  const files = await em.find(SourceFile, { rig, purpose: 'trials', $not: { storageKey: { $like: 'session:%' } } }, { orderBy: { createdAt: 'desc' }, limit: 10 });
  const photos = await em.find(SourceFile, { rig, purpose: 'photo' }, { orderBy: { createdAt: 'desc' }, limit: 24 });
  return { files, photos };
}
