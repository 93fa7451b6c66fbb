/** The demo lab's operating plan (fixtures/demo-plan.ts) on its coil rig. */
import type { EntityManager } from '@mikro-orm/postgresql';
import { OperatingPlan, Rig, type LabRow, type UserRow } from '../entities';
import { demoPlan } from '../fixtures/demo-plan';

export async function seedPlanDemo(tx: EntityManager, lab: LabRow, engineer: UserRow): Promise<void> {
  const rig = await tx.findOneOrFail(Rig, { lab, name: demoPlan.rig });
  tx.create(OperatingPlan, { lab, rig, createdBy: engineer, name: demoPlan.name, loop: demoPlan.loop, steps: demoPlan.steps });
}
