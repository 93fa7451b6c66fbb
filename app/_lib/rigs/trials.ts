import 'server-only';
import type { TrialDto } from '@/app/_contracts/dto';
import { raw, type EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Trial, TrialChange, type RigRow, type TrialRow, type UserRow } from '@/entities';
import { parseQuantity, type QuantityKind } from '@/analysis/units/parse-quantity';
import { HttpError, notFound } from '../server/errors';
import { UUID } from './rigs';

/** A quantity given as a number in the SI unit named by the key, or as a string with its unit ("4.5 gpm"). */
const quantity = (kind: QuantityKind, field: string) =>
  z.union([z.number().finite(), z.string().trim().min(1)]).transform((v, ctx) => {
    if (typeof v === 'number') return v;
    try {
      return parseQuantity(v, kind, field);
    } catch (e) {
      ctx.addIssue({ code: 'custom', message: (e as Error).message });
      return z.NEVER;
    }
  });

/**
 * One trial as scripts and the entry form send it. Numbers are SI (m³, s, m³/s, °C); strings
 * carry their unit. Either a flow or a bucket volume with fill times is required.
 */
export const trialInput = z
  .object({
    startedAt: z.coerce.date().optional(),
    bucketVolume: quantity('volume', 'bucketVolume').optional(),
    fillTimesS: z.array(z.number().finite().positive('Fill times must be positive.')).min(1).max(20).optional(),
    flow: quantity('volumeFlow', 'flow').optional(),
    inlet: quantity('temperature', 'inlet'),
    outlet: quantity('temperature', 'outlet'),
    ambient: quantity('temperature', 'ambient').optional(),
    isReference: z.boolean().optional(),
    notes: z.string().max(2000).default(''),
  })
  .strict()
  .superRefine((t, ctx) => {
    if (t.flow === undefined && (t.bucketVolume === undefined || !t.fillTimesS)) {
      ctx.addIssue({ code: 'custom', path: ['flow'], message: 'Give a flow, or a bucket volume with one or more fill times.' });
    }
    if (t.bucketVolume !== undefined && t.bucketVolume <= 0) ctx.addIssue({ code: 'custom', path: ['bucketVolume'], message: 'The bucket volume must be positive.' });
    if (t.flow !== undefined && t.flow <= 0) ctx.addIssue({ code: 'custom', path: ['flow'], message: 'The flow must be positive (zero flow through a heated coil is a dead-headed coil: steam risk).' });
    for (const [k, v] of [['inlet', t.inlet], ['outlet', t.outlet], ['ambient', t.ambient]] as const) {
      if (v !== undefined && (v < -40 || v > 150)) ctx.addIssue({ code: 'custom', path: [k], message: `${k} ${v} °C is outside −40…150 °C.` });
    }
  });
export type TrialInput = z.infer<typeof trialInput>;

/** Plausibility warnings that do not block saving. */
export function trialWarnings(t: { inletTempC: number; outletTempC: number; fillTimesS?: number[] | null }): string[] {
  const w: string[] = [];
  if (t.outletTempC < t.inletTempC) w.push('The outlet is colder than the inlet: check the sensors are not swapped.');
  if (t.outletTempC >= 100) w.push('The outlet is at or above 100 °C: water that hot flashes to steam when released.');
  if (t.fillTimesS?.some((s) => s < 3)) w.push('A fill took under 3 s: timing error dominates; use a bigger bucket.');
  return w;
}

export function toTrialFields(t: TrialInput) {
  const meanFill = t.fillTimesS ? t.fillTimesS.reduce((a, b) => a + b, 0) / t.fillTimesS.length : undefined;
  const flowM3PerS = t.flow ?? t.bucketVolume! / meanFill!;
  return {
    startedAt: t.startedAt ?? new Date(),
    bucketVolumeM3: t.bucketVolume ?? null,
    fillTimesS: t.fillTimesS ?? null,
    flowM3PerS,
    inletTempC: t.inlet,
    outletTempC: t.outlet,
    ambientTempC: t.ambient ?? null,
    isReference: t.isReference ?? false,
    notes: t.notes,
  };
}

/** Writes trials of one rig in one transaction: all of them or none. */
export async function createTrials(em: EntityManager, rig: RigRow, inputs: TrialInput[], origin: 'manual' | 'api'): Promise<{ rows: TrialRow[]; warnings: { index: number; messages: string[] }[] }> {
  const warnings: { index: number; messages: string[] }[] = [];
  const rows = await em.transactional(async (tx) =>
    inputs.map((input, index) => {
      const fields = toTrialFields(input);
      const w = trialWarnings(fields);
      if (w.length) warnings.push({ index, messages: w });
      return tx.create(Trial, { lab: rig.lab, rig, origin, ...fields });
    }),
  );
  return { rows, warnings };
}

export const SORTABLE = ['startedAt', 'flowM3PerS', 'inletTempC', 'outletTempC', 'createdAt'] as const;
export const listQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(50),
  sort: z.enum(SORTABLE).default('startedAt'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  excluded: z.enum(['all', 'included', 'excluded']).default('all'),
  reference: z.enum(['all', 'only']).default('all'),
  q: z.string().max(100).default(''),
});

export async function listTrials(em: EntityManager, rig: RigRow, q: z.infer<typeof listQuery>) {
  const where: Record<string, unknown> = { rig, lab: rig.lab };
  if (q.excluded !== 'all') where.excluded = q.excluded === 'excluded';
  if (q.reference === 'only') where.isReference = true;
  if (q.q) where.notes = { $ilike: `%${q.q.replace(/[%_\\]/g, (c) => '\\' + c)}%` };
  const [rows, total] = await em.findAndCount(Trial, where, {
    orderBy: { [q.sort]: q.dir, id: 'asc' },
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  // the hottest inlet and outlet of every matching trial, not only of this page, for the cautions beside the table
  const agg = await em.createQueryBuilder(Trial).select([raw('max(inlet_c) as inlet_c'), raw('max(outlet_c) as outlet_c')]).where(where).execute<{ inlet_c: number | string | null; outlet_c: number | string | null }>('get', false);
  const asNum = (v: number | string | null | undefined) => (v === null || v === undefined ? null : Number(v));
  const hottest = { inletTempC: asNum(agg?.inlet_c), outletTempC: asNum(agg?.outlet_c) };
  return { rows, total, page: q.page, pageSize: q.pageSize, hottest };
}

export const trialPatch = z.object({ notes: z.string().max(2000).optional(), excluded: z.boolean().optional() }).strict();

/** Edits notes or the exclusion flag and records who changed what. */
export async function updateTrials(em: EntityManager, trials: TrialRow[], patch: z.infer<typeof trialPatch>, user: UserRow) {
  for (const t of trials) {
    for (const field of ['notes', 'excluded'] as const) {
      const next = patch[field];
      if (next === undefined || next === t[field]) continue;
      em.create(TrialChange, { trial: t, user, field, before: t[field], after: next });
      (t as Record<string, unknown>)[field] = next;
    }
  }
  await em.flush();
}

export async function trialsOfRig(em: EntityManager, rig: RigRow, ids: string[]): Promise<TrialRow[]> {
  if (ids.some((id) => !UUID.test(id))) throw new HttpError(422, 'invalid', 'Some trial ids are not valid.');
  const rows = await em.find(Trial, { id: { $in: ids }, rig });
  if (rows.length !== new Set(ids).size) throw notFound('Some of those trials are not in this rig.');
  return rows;
}

export const trialDto = (t: TrialRow): TrialDto => ({
  id: t.id,
  rigId: t.rig.id,
  startedAt: t.startedAt.toISOString(),
  bucketVolumeM3: t.bucketVolumeM3 ?? null,
  fillTimesS: t.fillTimesS ?? null,
  flowM3PerS: t.flowM3PerS,
  inletTempC: t.inletTempC,
  outletTempC: t.outletTempC,
  ambientTempC: t.ambientTempC ?? null,
  isReference: t.isReference,
  excluded: t.excluded,
  notes: t.notes,
  origin: t.origin,
  sourceFileId: t.sourceFile?.id ?? null,
  sourceLine: t.sourceLine ?? null,
  warnings: trialWarnings(t),
});
