import 'server-only';
import { MikroORM, type EntityManager } from '@mikro-orm/postgresql';
import config from '@/mikro-orm.config';

/**
 * One ORM per process. The init *promise* is cached on globalThis before any await, so two
 * concurrent first requests share it (and hot reload in development does not open a second pool).
 */
const g = globalThis as typeof globalThis & { __emberlineOrm?: Promise<MikroORM> };

export function getOrm(): Promise<MikroORM> {
  if (!g.__emberlineOrm) {
    g.__emberlineOrm = MikroORM.init(config).catch((e: unknown) => {
      g.__emberlineOrm = undefined; // let the next request try again
      throw e;
    });
  }
  return g.__emberlineOrm;
}

/** A fresh EntityManager fork for one request: its identity map is never shared. */
export async function getEm(): Promise<EntityManager> {
  return (await getOrm()).em.fork();
}
