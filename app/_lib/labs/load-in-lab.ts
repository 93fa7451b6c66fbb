import 'server-only';
import { Comparison, Fit, ImportJob, OperatingPlan, Rig, ShareLink, SourceFile, Study, TestSession, Trial } from '@/entities';
import type { ComparisonRow, FitRow, ImportJobRow, OperatingPlanRow, RigRow, ShareLinkRow, SourceFileRow, StudyRow, TestSessionRow, TrialRow } from '@/entities';
import type { Viewer } from '../accounts/viewer';
import { DomainError, notFound } from '../server/errors';
import { loadRefs } from '../server/db';
import type { Member, RouteContext } from '../server/route';
import { can, type Action } from './permissions';

/** The one rule for ids in paths and bodies: a UUID, anything else is not found. */
export const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export const isUuid = (s: unknown): s is string => typeof s === 'string' && UUID.test(s);

/** The records of a lab that are loaded by id, and the relations each load brings along (by key: `loadRefs`). */
const KINDS = {
  rig: { entity: Rig, populate: [] },
  trial: { entity: Trial, populate: [] },
  fit: { entity: Fit, populate: ['createdBy', 'rig'] },
  study: { entity: Study, populate: ['updatedBy', 'createdBy'] },
  file: { entity: SourceFile, populate: [] },
  share: { entity: ShareLink, populate: ['study'] },
  job: { entity: ImportJob, populate: [] },
  session: { entity: TestSession, populate: ['rig'] },
  comparison: { entity: Comparison, populate: ['createdBy'] },
  plan: { entity: OperatingPlan, populate: ['rig'] },
} as const;
export type LabRecord = keyof typeof KINDS;
interface Rows { rig: RigRow; trial: TrialRow; fit: FitRow; study: StudyRow; file: SourceFileRow; share: ShareLinkRow; job: ImportJobRow; session: TestSessionRow; comparison: ComparisonRow; plan: OperatingPlanRow }

/** Who asks: a route's context (a session or a token) or a server page's viewer with a current lab. */
export type Scope = RouteContext<unknown> | (Viewer & { current: NonNullable<Viewer['current']> });

/**
 * Loads a record of a lab by id and authorizes the object, not only the person — the one way
 * every route and page does it:
 * - from a route: the record by id, then the caller's membership of *its* lab with the action
 *   (`ctx.requireMember`: 404 for someone outside the lab or a token of another lab, 403 for a
 *   role without the action);
 * - from a page: the record by id *in the viewer's current lab*, and the viewer's role there; a
 *   page shows the not-found page either way (no hint of what exists).
 * @throws DomainError not_found / forbidden (routes); Next.js not-found (pages)
 */
export async function loadInLab<K extends LabRecord>(scope: Scope, kind: K, id: string, action: Action): Promise<{ row: Rows[K]; member: Member }> {
  const { entity, populate } = KINDS[kind];
  if ('requireMember' in scope) {
    scope.requireActor();
    if (!isUuid(id)) throw notFound();
    const row = (await scope.em.findOne(entity as never, { id } as never)) as Rows[K] | null;
    if (!row) throw notFound();
    const member = await scope.requireMember(row.lab.id, action);
    await loadRefs(scope.em, [row], populate);
    return { row, member };
  }
  try {
    if (!isUuid(id) || !can(scope.current.role, action)) throw notFound();
    const row = (await scope.em.findOne(entity as never, { id, lab: scope.current.lab } as never)) as Rows[K] | null;
    if (!row) throw notFound();
    await loadRefs(scope.em, [row], populate);
    return { row, member: { lab: scope.current.lab, role: scope.current.role } };
  } catch (e) {
    // imported here, not at the top: modules that only need isUuid (sensor-overview.ts) are also
    // loaded outside Next (bench/import.ts, bench/study.ts), where next/navigation cannot load
    if (e instanceof DomainError && e.kind === 'not_found') (await import('next/navigation')).notFound();
    throw e;
  }
}
