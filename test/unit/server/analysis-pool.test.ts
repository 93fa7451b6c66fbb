/**
 * The analysis worker pool (app/_lib/server/analysis-pool.ts) with real worker threads: a fit
 * computed in a thread is the same as in the test's own thread, errors cross back as the classes
 * the route wrapper maps (InputError → 422, DomainError → its status), and a full queue is refused
 * at once with 503 and Retry-After. Trials from the constant-source coil of DOMAIN.md §1.2
 * (Ts 90 °C, Tin 20 °C, UA 500 W/K) with seeded noise.
 */
import { afterAll, beforeAll, describe, expect, test, vi } from 'vitest';
import type { DomainError } from '../../../app/_lib/server/errors';
import type { InputError } from '../../../analysis/units/reading-input';
import { computeAnalysis, type AnalyzeTask } from '../../../app/_lib/fits/fit-compute';
import { coilTrials } from '../plots/support';

type Pool = typeof import('../../../app/_lib/server/analysis-pool');

const data = coilTrials();
const task: AnalyzeTask = {
  data,
  models: ['coil'],
  measurementSdK: 0.3,
  planInletC: 20,
  labels: data.x.map((_, i) => `trial ${i + 1}`),
  times: data.x.map((_, i) => new Date(Date.UTC(2026, 5, 1, 9, i)).toISOString()),
  excluded: [],
  detail: 'display',
};

describe('analysis pool with worker threads (one thread, a queue of one)', () => {
  let pool: Pool;
  let errorResponse: typeof import('../../../app/_lib/server/error-response').errorResponse;
  // the classes as the freshly loaded pool module sees them
  let InputErrorClass: typeof InputError;
  beforeAll(async () => {
    vi.stubEnv('EMBERLINE_ANALYSIS_THREADS', '1');
    vi.stubEnv('EMBERLINE_ANALYSIS_QUEUE', '1');
    vi.resetModules();
    pool = await import('../../../app/_lib/server/analysis-pool');
    ({ errorResponse } = await import('../../../app/_lib/server/error-response'));
    ({ InputError: InputErrorClass } = await import('../../../analysis/units/reading-input'));
  });
  afterAll(() => vi.unstubAllEnvs());

  test('a task beyond the queue is refused at once with 503 and Retry-After; those before it still run', async () => {
    // the pool is new: its thread is still loading; it will take the first task, the second waits in the queue (of one)
    const first = pool.runAnalysis('analyze', task);
    const second = pool.runAnalysis('analyze', task);
    const third = pool.runAnalysis('analyze', task);
    const refused = await third.then(() => null, (e: unknown) => e);
    expect(refused).toBeInstanceOf(Error);
    expect((refused as DomainError).kind).toBe('unavailable');
    const res = errorResponse(refused);
    expect(res.status).toBe(503);
    expect(res.headers.get('retry-after')).toBe('2');
    expect((await res.json()).message).toMatch(/busy with other analyses.*try again in 2 s/);
    await expect(Promise.all([first, second])).resolves.toHaveLength(2);
  }, 120_000);

  test('a fit in a worker thread gives the same numbers as in this thread (bit for bit, through structured clone)', async () => {
    const there = await pool.runAnalysis('analyze', task);
    const here = computeAnalysis(task);
    expect(there).toEqual(JSON.parse(JSON.stringify(here)));
    // and it recovers the coil it was drawn from within its 95 % intervals (DOMAIN.md §1.2)
    const coil = there.fits[0];
    expect(coil.params.UA.ciLow).toBeLessThan(500);
    expect(coil.params.UA.ciHigh).toBeGreaterThan(500);
  }, 120_000);

  test('errors cross back as the classes the route wrapper maps: InputError (422) naming the field', async () => {
    const e = await pool.runAnalysis('forecast', { body: { volume: 'ten buckets' }, fitNote: null, units: 'si', render: 'data' }).then(() => null, (x: unknown) => x);
    expect(e).toBeInstanceOf(InputErrorClass);
    const res = errorResponse(e);
    expect(res.status).toBe(422);
    expect(Object.keys((await res.json()).fields)).toEqual([(e as InputError).field]);
  }, 120_000);
});
