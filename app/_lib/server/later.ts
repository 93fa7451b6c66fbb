import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { getEm } from './db';

/** Work started off the request path and not finished yet (tests and shutdown can wait for it). */
const pending = new Set<Promise<void>>();
/** Beyond this many unfinished tasks new ones are dropped (and logged): a flood cannot grow memory. */
const MAX_PENDING = 200;

/**
 * Runs `work` after the response, with an EntityManager of its own, so that the answer does not
 * depend on it — neither its time (the same either way: account enumeration by timing) nor its
 * failure (logged, never shown). Used for mail that must not tell whether an address has an account.
 */
export function runLater(what: string, work: (em: EntityManager) => Promise<void>): void {
  if (pending.size >= MAX_PENDING) {
    console.error(`${what}: dropped, ${MAX_PENDING} background tasks are still running`);
    return;
  }
  const task = (async () => {
    await new Promise((r) => setImmediate(r));
    const em = await getEm();
    await work(em);
    await em.flush();
  })()
    .catch((e: unknown) => console.error(`${what} failed:`, e instanceof Error ? e.message : e))
    .finally(() => pending.delete(task));
  pending.add(task);
}
