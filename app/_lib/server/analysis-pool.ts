import 'server-only';
import os from 'node:os';
import path from 'node:path';
import { Piscina } from 'piscina';
import { InputError } from '@/analysis/units/reading-input';
import type { TaskInput, TaskName, TaskOutput, TaskReply } from '../analysis-worker/tasks';
import { DomainError, unavailable } from './errors';

/**
 * The one analysis worker pool (piscina): every fit, comparison, forecast and server-side plot
 * runs here, off the request thread, which only parses, authorizes, queries and streams. One
 * thread per core (`EMBERLINE_ANALYSIS_THREADS` overrides), started at the first task and kept
 * (their TypeScript is compiled once, by tsx, in each thread); a bounded queue of
 * `EMBERLINE_ANALYSIS_QUEUE` tasks (default 16 per thread) behind them. When the queue is full a
 * task is refused at once with a DomainError `unavailable` (503 with Retry-After) rather than
 * waiting for seconds behind the others.
 */
const threadsEnv = process.env.EMBERLINE_ANALYSIS_THREADS;
/**
 * FOR TESTS ONLY: `EMBERLINE_ANALYSIS_THREADS=0` (set by vitest.config.mts) runs each task in the
 * calling thread, so unit tests that call `app/_lib` functions directly need no worker threads
 * (which would compile the TypeScript again with tsx). The servers (`npm start`, `npm test`'s
 * server, the benchmarks) never set it; the one-shot demo seed (scripts/setup-db.ts) does, so that no
 * worker threads outlive it.
 */
const IN_PROCESS = threadsEnv === '0';
export const ANALYSIS_THREADS = Math.max(1, Math.floor(Number(threadsEnv) || os.availableParallelism()));
export const ANALYSIS_QUEUE = Math.max(1, Math.floor(Number(process.env.EMBERLINE_ANALYSIS_QUEUE) || 16 * ANALYSIS_THREADS));
/** Seconds a refused client is asked to wait: the queue drains in about that (tasks take milliseconds to a few hundred). */
const RETRY_AFTER_S = 2;

/**
 * The worker's entry beside its tasks. Found from the project root (the server's working
 * directory, as `npm start`, `npm test` and the benchmarks run it; EMBERLINE_ROOT overrides) and
 * not through the bundler: the worker loads the TypeScript sources with tsx.
 */
const ENTRY = path.join(process.env.EMBERLINE_ROOT ?? process.cwd(), 'app', '_lib', 'analysis-worker', 'entry.cjs');

const g = globalThis as unknown as { __emberlineAnalysisPool?: Piscina };

function pool(): Piscina {
  g.__emberlineAnalysisPool ??= new Piscina({
    filename: ENTRY,
    minThreads: ANALYSIS_THREADS,
    maxThreads: ANALYSIS_THREADS,
    // one more than ours: runAnalysis refuses before piscina would (see there)
    maxQueue: ANALYSIS_QUEUE + 1,
    idleTimeout: Number.POSITIVE_INFINITY,
  });
  return g.__emberlineAnalysisPool;
}

/** Starts the threads now (at server start), so the first fit does not wait for them to load. */
export function warmAnalysisPool(): void {
  if (!IN_PROCESS) pool();
}

/** The tests-only path (see IN_PROCESS): the same task function and the same error revival, in this thread. */
async function inProcess<N extends TaskName>(name: N, input: TaskInput<N>): Promise<TaskOutput<N>> {
  const { runTask } = await import('../analysis-worker/tasks');
  // a structured clone each way, as between threads, so a test sees what a worker would return
  const reply = structuredClone(runTask({ name, input: structuredClone(input) })) as TaskReply<TaskOutput<N>>;
  if (!reply.ok) throw revive(reply.error);
  return reply.value;
}

function refused(): DomainError {
  return unavailable(`The server is busy with other analyses (${ANALYSIS_QUEUE} waiting). Nothing was changed; try again in ${RETRY_AFTER_S} s.`, RETRY_AFTER_S, 'analysis_busy');
}

/** Raises in the request thread the error the task threw in its worker. */
function revive(e: Extract<TaskReply, { ok: false }>['error']): Error {
  if (e.type === 'domain') return new DomainError(e.kind, e.code, e.message, e.details);
  if (e.type === 'input') return new InputError(e.message, e.field);
  const err = new Error(`analysis task failed: ${e.name}: ${e.message}`);
  if (e.stack) err.stack = `${err.message}\n--- in the analysis worker ---\n${e.stack}`;
  return err;
}

/**
 * Runs one analysis task in the pool and resolves with its result (structured-cloned back).
 * @throws DomainError unavailable (503, Retry-After) when the queue is full; the task's own
 *   DomainError or InputError as it threw it; an Error for anything else (a logged 500)
 * @example const analysis = await runAnalysis('analyze', task)
 */
export async function runAnalysis<N extends TaskName>(name: N, input: TaskInput<N>): Promise<TaskOutput<N>> {
  if (IN_PROCESS) return inProcess(name, input);
  const p = pool();
  // checked and queued in one synchronous step, so piscina's own limit (one higher) is never reached
  if (p.queueSize >= ANALYSIS_QUEUE) throw refused();
  const reply: TaskReply<TaskOutput<N>> = await p.run({ name, input });
  if (!reply.ok) throw revive(reply.error);
  return reply.value;
}
