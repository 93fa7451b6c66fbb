/** Loads the demo lab (fixtures/demo-lab.ts) once; a second run changes nothing. */
import type { EntityManager } from '@mikro-orm/postgresql';
import { hash } from '@node-rs/argon2';
import { Lab, Membership, Rig, Trial, User } from '../entities';
import { DEMO_PASSWORD, demoLab, demoUsers, generateTrials, rigPlans } from '../fixtures/demo-lab';
import { ARGON2_OPTIONS } from '../app/_lib/accounts/password-options';
import { seedSolarDemo } from './seed-solar';

export async function seedDemoLab(em: EntityManager): Promise<boolean> {
  if (await em.findOne(Lab, { slug: demoLab.slug })) return false;
  await em.transactional(async (tx) => {
    const lab = tx.create(Lab, { ...demoLab, isDemo: true });
    const passwordHash = await hash(DEMO_PASSWORD, ARGON2_OPTIONS);
    for (const u of demoUsers) {
      const user = (await tx.findOne(User, { email: u.email })) ?? tx.create(User, { email: u.email, name: u.name, passwordHash });
      tx.create(Membership, { user, lab, role: u.role });
    }
    for (const plan of rigPlans) {
      const rig = tx.create(Rig, { lab, name: plan.name, heatSource: plan.heatSource, description: plan.description, details: plan.details });
      for (const t of generateTrials(plan)) tx.create(Trial, { lab, rig, origin: 'demo', ...t });
    }
    seedSolarDemo(tx, lab);
  });
  return true;
}
