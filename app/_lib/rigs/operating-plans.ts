import 'server-only';
/**
 * Operating plans of a rig: the API's body (`operatingPlanInput`, SI, at most MAX_PLAN_STEPS
 * steps), saving, editing and deleting them, the list of a rig and the DTO with its cautions
 * (`checkOperatingPlan` of analysis/safety, the rule the rig page's form runs in the browser).
 * Routes authorize the rig or the plan with `loadInLab` before calling in here.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { OperatingPlan, type LabRow, type OperatingPlanRow, type RigRow, type UserRow } from '@/entities';
import { checkOperatingPlan, LOOP_KINDS, MAX_PLAN_STEPS, OPERATING_STEP_KINDS, PLAN_VALVES, RELIEF_KINDS, type OperatingPlanDto, type OperatingStep } from '@/app/_contracts/operating-plan';
import { isUuid } from '../labs/load-in-lab';
import { invalid } from '../server/errors';

/** Most plans a rig keeps (a list on its page, not a log). */
export const MAX_PLANS_PER_RIG = 50;

const step = z
  .object({
    kind: z.enum(OPERATING_STEP_KINDS),
    valve: z.enum(PLAN_VALVES).optional(),
    /** m³/s; 0.01 m³/s is 600 L/min, beyond any pump of this trade */
    flowM3PerS: z.number().min(0, 'A flow cannot be negative.').max(0.01, 'At most 0.01 m³/s (600 L/min).').optional(),
    minutes: z.number().positive('Wait more than 0 minutes.').max(24 * 60, 'Wait at most 24 hours in one step.').optional(),
    coilBelowC: z.number().min(0, 'At least 0 °C.').max(100, 'At most 100 °C.').optional(),
    note: z.string().trim().max(200).optional(),
  })
  .strict()
  .superRefine((s, ctx) => {
    const need = (field: keyof typeof s, message: string) => s[field] === undefined && ctx.addIssue({ code: 'custom', path: [field], message });
    if (s.kind === 'valve-open' || s.kind === 'valve-closed') need('valve', 'Say which valve.');
    if (s.kind === 'flow-set') need('flowM3PerS', 'Give the flow.');
    if (s.kind === 'wait') need('minutes', 'Give the minutes to wait.');
    if (s.kind === 'wait-until-cold') need('coilBelowC', 'Give the coil temperature to wait for.');
  });

/** The body of POST /api/rigs/:rigId/plans and PUT /api/plans/:planId (SI: m³/s, °C, minutes). */
export const operatingPlanInput = z
  .object({
    name: z.string().trim().min(1, 'Name the plan.').max(120),
    steps: z.array(step).min(1, 'Add at least one step.').max(MAX_PLAN_STEPS, `A plan holds at most ${MAX_PLAN_STEPS} steps.`),
    loop: z.object({ loop: z.enum(LOOP_KINDS), relief: z.enum(RELIEF_KINDS) }).strict(),
  })
  .strict();
export type OperatingPlanInput = z.infer<typeof operatingPlanInput>;

/** A step with only the fields of its kind (what is stored). */
function clean(s: OperatingPlanInput['steps'][number]): OperatingStep {
  const note = s.note ? { note: s.note } : {};
  switch (s.kind) {
    case 'valve-open': case 'valve-closed': return { kind: s.kind, valve: s.valve, ...note };
    case 'flow-set': return { kind: s.kind, flowM3PerS: s.flowM3PerS, ...note };
    case 'wait': return { kind: s.kind, minutes: s.minutes, ...note };
    case 'wait-until-cold': return { kind: s.kind, coilBelowC: s.coilBelowC, ...note };
    default: return { kind: s.kind, ...note };
  }
}

/** The plans of a rig, oldest first. */
// the rig is loaded already (its plans point at that same record): no join
export const plansOfRig = (em: EntityManager, rig: RigRow) => em.find(OperatingPlan, { rig }, { orderBy: { createdAt: 'asc' }, limit: MAX_PLANS_PER_RIG });

/** The plans of a lab with their rigs, for the study editor's picker. */
export const plansOfLab = (em: EntityManager, lab: LabRow) => em.find(OperatingPlan, { lab }, { populate: ['rig'], orderBy: { createdAt: 'asc' }, limit: 200 });

/** One plan of a lab by id (for a study block of that lab), or null. */
export const planInLab = (em: EntityManager, lab: LabRow, id: unknown) => (isUuid(id) ? em.findOne(OperatingPlan, { id, lab }, { populate: ['rig'] }) : Promise.resolve(null));

/**
 * Saves a new plan of the rig (one row, one flush).
 * @throws DomainError invalid when the rig already keeps MAX_PLANS_PER_RIG plans
 */
export async function createPlan(em: EntityManager, rig: RigRow, user: UserRow, input: OperatingPlanInput): Promise<OperatingPlanRow> {
  if ((await em.count(OperatingPlan, { rig })) >= MAX_PLANS_PER_RIG) throw invalid(`A rig keeps at most ${MAX_PLANS_PER_RIG} operating plans: delete one first.`, { name: 'too many plans on this rig' });
  const row = em.create(OperatingPlan, { lab: rig.lab, rig, createdBy: user, name: input.name, steps: input.steps.map(clean), loop: input.loop });
  await em.flush();
  return row;
}

/** Replaces a plan's name, steps and loop. */
export async function updatePlan(em: EntityManager, row: OperatingPlanRow, input: OperatingPlanInput): Promise<OperatingPlanRow> {
  em.assign(row, { name: input.name, steps: input.steps.map(clean), loop: input.loop });
  await em.flush();
  return row;
}

export async function deletePlan(em: EntityManager, row: OperatingPlanRow): Promise<void> {
  await em.remove(row).flush();
}

/** The plan for the browser, with the cautions the checker raises now. */
export function planDto(row: OperatingPlanRow): OperatingPlanDto {
  return {
    id: row.id,
    rigId: row.rig.id,
    rigName: row.rig.name,
    name: row.name,
    steps: row.steps,
    loop: row.loop,
    cautions: checkOperatingPlan(row.steps, row.loop),
    updatedAt: row.updatedAt.toISOString(),
  };
}
