import 'server-only';
/**
 * Design comparisons of a lab: what to compare (two to MAX_COMPARED rigs or saved fits) and at
 * which conditions. Saving authorizes every rig and fit with `loadInLab` and keeps them to the
 * comparison's own lab; reading loads them by id within that lab only.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Comparison, Fit, Rig, type ComparisonRow, type FitRow, type LabRow, type RigRow } from '@/entities';
import type { ComparisonSubject } from '@/entities/comparison';
import { MODEL_CHOICES } from '@/app/_contracts/models';
import { loadInLab, isUuid } from '../labs/load-in-lab';
import { invalid, notFound } from '../server/errors';
import type { RouteContext } from '../server/route';
import { comparisonView } from './comparison-view';
import { SOFTWARE_VERSION } from '../fits/fit-analysis';
import type { StudyExport } from '../exports';
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { DesignComparisonView } from '@/app/_contracts/design-comparison';

/** Most designs in one comparison: each is fitted and bootstrapped against the first (bounded work per request). */
export const MAX_COMPARED = 4;

const subject = z
  .object({
    kind: z.enum(['rig', 'fit']),
    id: z.string().max(40),
    model: z.enum(MODEL_CHOICES.map((m) => m.id) as [string, ...string[]]).optional(),
  })
  .strict();

/** The body of POST /api/labs/:labId/comparisons (SI: °C and m³/s). */
export const comparisonInput = z
  .object({
    title: z.string().trim().min(1, 'Give the comparison a title.').max(160),
    subjects: z.array(subject).min(2, 'Pick at least two rigs or saved fits.').max(MAX_COMPARED, `Compare at most ${MAX_COMPARED} designs at once.`),
    inletTempC: z.number().min(0.5).max(95).optional(),
    flowM3PerS: z.number().positive().max(0.01).optional(),
  })
  .strict();
export type ComparisonInput = z.infer<typeof comparisonInput>;

/** A design's record, loaded. */
export type LoadedSubject = { subject: ComparisonSubject; rig: RigRow; fit: FitRow | null };

/**
 * Saves a comparison. Every rig and fit is loaded with `loadInLab` (404 outside the caller's
 * labs, 403 without read access) and must belong to the comparison's lab.
 * @throws DomainError not_found for a design of another lab; invalid for the same design twice or
 *   fewer than two designs that can be fitted
 */
export async function createComparison(ctx: RouteContext<{ labId: string }>, input: ComparisonInput): Promise<ComparisonRow> {
  const lab = ctx.member!.lab;
  const seen = new Set<string>();
  const loaded: LoadedSubject[] = [];
  for (const [i, s] of input.subjects.entries()) {
    if (seen.has(`${s.kind}:${s.id}`)) throw invalid('The same design is listed twice.', { [`subjects.${i}`]: 'listed twice' });
    seen.add(`${s.kind}:${s.id}`);
    if (s.kind === 'rig') {
      const { row } = await loadInLab(ctx, 'rig', s.id, 'lab:read');
      if (row.lab.id !== lab.id) throw notFound();
      loaded.push({ subject: { kind: 'rig', id: row.id, ...(s.model ? { model: s.model } : {}) }, rig: row, fit: null });
    } else {
      const { row } = await loadInLab(ctx, 'fit', s.id, 'lab:read');
      if (row.lab.id !== lab.id) throw notFound();
      loaded.push({ subject: { kind: 'fit', id: row.id }, rig: row.rig, fit: row });
    }
  }
  // refused before anything is stored when fewer than two designs can be fitted (422 naming why)
  await comparisonView(ctx.em, { title: input.title, loaded, inletTempC: input.inletTempC, flowM3PerS: input.flowM3PerS }, 'si', { plots: false });
  const row = ctx.em.create(Comparison, {
    lab, createdBy: ctx.requireActor().user, title: input.title, subjects: loaded.map((l) => l.subject),
    settings: { ...(input.inletTempC !== undefined ? { inletTempC: input.inletTempC } : {}), ...(input.flowM3PerS !== undefined ? { flowM3PerS: input.flowM3PerS } : {}) },
  });
  await ctx.em.flush();
  return row;
}

/**
 * The designs of a saved comparison, loaded by id within the comparison's lab only (the
 * comparison itself was authorized by `loadInLab`); a rig or fit deleted since is named in `missing`.
 */
export async function subjectsOf(em: EntityManager, c: ComparisonRow): Promise<{ loaded: LoadedSubject[]; missing: string[] }> {
  const subjects = c.subjects.filter((s) => isUuid(s.id)).slice(0, MAX_COMPARED);
  const rigIds = subjects.filter((s) => s.kind === 'rig').map((s) => s.id);
  const fitIds = subjects.filter((s) => s.kind === 'fit').map((s) => s.id);
  const [rigs, fits] = await Promise.all([
    rigIds.length ? em.find(Rig, { id: { $in: rigIds }, lab: c.lab }) : [],
    fitIds.length ? em.find(Fit, { id: { $in: fitIds }, lab: c.lab }, { populate: ['rig'] }) : [],
  ]);
  const loaded: LoadedSubject[] = [];
  const missing: string[] = [];
  for (const s of subjects) {
    if (s.kind === 'rig') {
      const rig = rigs.find((r) => r.id === s.id);
      if (rig) loaded.push({ subject: s, rig, fit: null });
      else missing.push('A rig of this comparison has been deleted.');
    } else {
      const fit = fits.find((f) => f.id === s.id);
      if (fit) loaded.push({ subject: s, rig: fit.rig, fit });
      else missing.push('A saved fit of this comparison has been deleted.');
    }
  }
  return { loaded, missing };
}

/** One comparison of a lab by id (for a study block of that lab), or null. */
export const comparisonInLab = (em: EntityManager, lab: LabRow, id: string) => (isUuid(id) ? em.findOne(Comparison, { id, lab }) : Promise.resolve(null));

/** A lab's comparisons, newest first. */
export const comparisonsOfLab = (em: EntityManager, lab: LabRow | string) =>
  em.find(Comparison, { lab }, { populate: ['createdBy'], orderBy: { createdAt: 'desc' }, limit: 200 });

export const comparisonListDto = (c: ComparisonRow) => ({
  id: c.id,
  title: c.title,
  designs: c.subjects.length,
  settings: c.settings,
  createdAt: c.createdAt.toISOString(),
  createdBy: c.createdBy?.name ?? null,
});

/** The comparison's numbers and plots in `units` (see comparison-view.ts). */
export async function readComparison(em: EntityManager, c: ComparisonRow, units: UnitSystem, opts: { publicView?: boolean } = {}): Promise<DesignComparisonView> {
  const { loaded, missing } = await subjectsOf(em, c);
  return comparisonView(em, { title: c.title, loaded, missing, inletTempC: c.settings.inletTempC, flowM3PerS: c.settings.flowM3PerS }, units, opts);
}

/** The comparison's workbook data: Summary (provenance) and the Comparison sheet. */
export async function comparisonExportData(em: EntityManager, c: ComparisonRow, labName: string, units: UnitSystem): Promise<StudyExport> {
  const view = await readComparison(em, c, units);
  return {
    unitSystem: units,
    provenance: {
      lab: labName,
      study: c.title,
      rig: [...new Set(view.designs.map((d) => d.rigName))].join(', '),
      model: [...new Set(view.designs.map((d) => d.modelLabel))].join(', '),
      softwareVersion: SOFTWARE_VERSION,
      settings: { 'Common inlet (°C)': view.inletTempC, 'Common flow (L/min)': Math.round(view.flowM3PerS * 60000 * 100) / 100, 'Confidence level': view.level },
    },
    comparisons: [view],
    notes: [view.verdict, ...view.notes, ...view.problems],
  };
}
