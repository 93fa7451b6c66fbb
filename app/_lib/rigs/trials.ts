import 'server-only';
import type { TrialDto } from '@/app/_contracts/dto';
import { raw, type EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Trial, TrialChange, type RigRow, type TrialRow, type UserRow } from '@/entities';
import { parseQuantity, type QuantityKind } from '@/analysis/units/parse-quantity';
import { DomainError, notFound } from '../server/errors';
import { checkTrialRow, plausibilityWarnings, trialFields, TRIAL_LIMITS, type CheckedTrialRow } from './trial-rule';
import { isUuid } from '../labs/load-in-lab';

/** A quantity given as a number in the SI unit named by the key, or as a string with its unit ("4.5 gpm"). */
export const quantity = (kind: QuantityKind, field: string) =>
  z.union([z.number(), z.string().trim().min(1)]).transform((v, ctx) => {
    if (typeof v === 'number') return v;
    try {
      return parseQuantity(v, kind, field);
    } catch (e) {
      ctx.addIssue({ code: 'custom', message: (e as Error).message });
      return z.NEVER;
    }
  });

/**
 * One trial as scripts and the entry form send it: numbers in SI (m³, s, m³/s, °C), or strings
 * with their unit. Only the shape is checked here; what a trial must hold is the one trial rule
 * (`trial-rule.ts`), which {@link apiTrialsToRows} applies.
 */
export const trialInput = z
  .object({
    startedAt: z.coerce.date().optional(),
    bucketVolume: quantity('volume', 'bucketVolume').optional(),
    fillTimesS: z.array(z.number()).max(TRIAL_LIMITS.maxFillTimes).optional(),
    flow: quantity('volumeFlow', 'flow').optional(),
    inlet: quantity('temperature', 'inlet').optional(),
    outlet: quantity('temperature', 'outlet').optional(),
    ambient: quantity('temperature', 'ambient').optional(),
    irradiance: quantity('irradiance', 'irradiance').optional(),
    wind: quantity('speed', 'wind').optional(),
    isReference: z.boolean().optional(),
    notes: z.string().max(TRIAL_LIMITS.maxNotes).optional(),
  })
  .strict();
export type TrialInput = z.infer<typeof trialInput>;

/** The API's field for each field of the trial rule (its messages name what the caller sent). */
const API_FIELD: Record<string, string> = {
  bucketVolumeM3: 'bucketVolume', fillTimesS: 'fillTimesS', flowM3PerS: 'flow', inletTempC: 'inlet', outletTempC: 'outlet',
  ambientTempC: 'ambient', irradianceWPerM2: 'irradiance', windMPerS: 'wind', isReference: 'isReference', notes: 'notes',
};

/**
 * The API's trials through the one trial rule: each is mapped onto the rule's SI fields and
 * checked. All or nothing: any refused trial throws 422 naming `field` (one trial) or
 * `trials.N.field` (a batch), with the rule's message.
 */
export function apiTrialsToRows(inputs: TrialInput[], batch: boolean): { row: CheckedTrialRow; startedAt: Date; warnings: string[] }[] {
  const fields: Record<string, string> = {};
  const out = inputs.map((t, i) => {
    const r = checkTrialRow({
      bucketVolumeM3: t.bucketVolume, fillTimesS: t.fillTimesS, flowM3PerS: t.flow, inletTempC: t.inlet, outletTempC: t.outlet,
      ambientTempC: t.ambient, irradianceWPerM2: t.irradiance, windMPerS: t.wind, isReference: t.isReference, notes: t.notes,
    }, i, API_FIELD);
    if (!r.ok) {
      for (const issue of r.issues) fields[`${batch ? `trials.${i}.` : ''}${API_FIELD[issue.field ?? ''] ?? issue.field ?? '_'}`] ??= issue.message;
      return null;
    }
    return { row: r.row, startedAt: t.startedAt ?? new Date(), warnings: r.issues.map((x) => x.message) };
  });
  if (Object.keys(fields).length) throw new DomainError('invalid', 'invalid', 'Some fields are not valid.', { fields });
  return out as { row: CheckedTrialRow; startedAt: Date; warnings: string[] }[];
}

/** The warnings shown with a stored trial (the trial rule's plausibility warnings). */
export function trialWarnings(t: { inletTempC: number; outletTempC: number; flowM3PerS: number; fillTimesS?: number[] | null }): string[] {
  return plausibilityWarnings(t).map((w) => w.message);
}

/** Writes trials of one rig in one transaction: all of them or none. */
export async function createTrials(em: EntityManager, rig: RigRow, inputs: TrialInput[], origin: 'manual' | 'api', batch = false): Promise<{ rows: TrialRow[]; warnings: { index: number; messages: string[] }[] }> {
  const checked = apiTrialsToRows(inputs, batch);
  const warnings = checked.flatMap((c, index) => (c.warnings.length ? [{ index, messages: c.warnings }] : []));
  const rows = await em.transactional(async (tx) => checked.map((c) => tx.create(Trial, { lab: rig.lab, rig, origin, ...trialFields(c.row, c.startedAt) })));
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

export const trialPatch = z.object({ notes: z.string().max(TRIAL_LIMITS.maxNotes).optional(), excluded: z.boolean().optional() }).strict();

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

/** The rig's latest trial (the entry form offers its values again). */
export const lastTrial = (em: EntityManager, rig: RigRow) => em.findOne(Trial, { rig }, { orderBy: { startedAt: 'desc' } });

/** Who changed what of a trial, oldest first. */
export async function trialHistory(em: EntityManager, trial: TrialRow) {
  const history = await em.find(TrialChange, { trial }, { populate: ['user'], orderBy: { createdAt: 'asc' } });
  return history.map((h) => ({ at: h.createdAt.toISOString(), by: h.user?.name ?? null, field: h.field, before: h.before, after: h.after }));
}

export async function trialsOfRig(em: EntityManager, rig: RigRow, ids: string[]): Promise<TrialRow[]> {
  if (ids.some((id) => !isUuid(id))) throw new DomainError('invalid', 'invalid', 'Some trial ids are not valid.');
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
  irradianceWPerM2: t.irradianceWPerM2 ?? null,
  windMPerS: t.windMPerS ?? null,
  isReference: t.isReference,
  excluded: t.excluded,
  notes: t.notes,
  origin: t.origin,
  sourceFileId: t.sourceFile?.id ?? null,
  sourceLine: t.sourceLine ?? null,
  warnings: trialWarnings(t),
});
