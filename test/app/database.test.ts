import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { MikroORM } from '@mikro-orm/postgresql';
import config from '../../mikro-orm.config';
import { Lab, Membership, Rig, Trial, User } from '../../entities';
import { seedDemoLab } from '../../scripts/seed';
import { demoLab, demoUsers, rigPlans } from '../../fixtures/demo-lab';
import { solarRig } from '../../fixtures/demo-solar';

describe('the data layer on the real PostgreSQL', () => {
  let orm: MikroORM;
  beforeAll(async () => {
    orm = await MikroORM.init(config);
  });
  afterAll(async () => orm?.close(true));

  test('the fresh test database holds the demo lab with its rigs, trials and members', async () => {
    const em = orm.em.fork();
    const lab = await em.findOneOrFail(Lab, { slug: demoLab.slug });
    expect(await em.count(Rig, { lab, name: { $in: rigPlans.map((p) => p.name) } })).toBe(rigPlans.length);
    expect(await em.count(Trial, { lab, origin: 'demo' })).toBe(rigPlans.reduce((n, p) => n + p.flowsLPerMin.length, 0));
    // the solar collector's trials are the steady periods of its logged day, found by the import (seventeen: sixteen plus one under broken cloud)
    expect(await em.count(Trial, { lab, rig: { name: solarRig.name }, origin: 'log-segment' })).toBe(17);
    for (const u of demoUsers) {
      const m = await em.findOneOrFail(Membership, { lab, user: { email: u.email } });
      expect(m.role).toBe(u.role);
    }
  });

  test('loading the demo lab a second time changes nothing', async () => {
    const counts = async () => {
      const em = orm.em.fork();
      return [await em.count(Lab), await em.count(User), await em.count(Rig), await em.count(Trial), await em.count(Membership)];
    };
    const before = await counts();
    expect(await seedDemoLab(orm.em.fork())).toBe(false);
    expect(await counts()).toEqual(before);
  });

  test('no migration is pending and the schema matches the entities', async () => {
    expect(await orm.getMigrator().getPendingMigrations()).toEqual([]);
    const diff = await orm.getSchemaGenerator().getUpdateSchemaSQL({ wrap: false });
    expect(diff.trim()).toBe('');
  });

  test('stored numbers come back as numbers, times as dates in UTC', async () => {
    const t = await orm.em.fork().findOneOrFail(Trial, { isReference: true }, { orderBy: { startedAt: 'asc' } });
    expect(typeof t.flowM3PerS).toBe('number');
    expect(t.startedAt).toBeInstanceOf(Date);
    expect(t.fillTimesS?.length).toBe(3);
  });

  test('a user serialised to JSON carries no password hash', async () => {
    const u = await orm.em.fork().findOneOrFail(User, { email: demoUsers[0].email });
    expect(u.passwordHash).toMatch(/^\$argon2id\$/);
    expect(JSON.stringify(u)).not.toMatch(/argon2|passwordHash/);
  });
});
