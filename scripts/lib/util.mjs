// Small helpers shared by the lifecycle scripts. Node built-ins only: these run before `npm ci`.
import { spawnSync, spawn } from 'node:child_process';
import { createServer } from 'node:net';
import os, { constants } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const osSignals = constants.signals;

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

/** A fault the user can act on: printed as one clear line, then the process exits 1. */
export class SetupError extends Error {
  name = 'SetupError';
}

export function fail(message) {
  throw new SetupError(message);
}

export function step(message) {
  console.log(`\x1b[33m▸\x1b[0m ${message}`);
}

/** Runs a command to completion; returns { status, stdout, stderr }. */
export function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { encoding: 'utf8', cwd: root, ...opts });
  if (r.error && r.error.code === 'ENOENT') return { status: 127, stdout: '', stderr: `${cmd}: not found` };
  return { status: r.status ?? 1, stdout: r.stdout ?? '', stderr: r.stderr ?? '' };
}

/** Runs a command with inherited output; throws SetupError with `what` when it fails. */
export function runVisible(cmd, args, what, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, ...opts });
  if (r.status !== 0) fail(what);
}

/** Resolves true when nothing listens on host:port. */
export function portIsFree(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const srv = createServer();
    srv.once('error', () => resolve(false));
    srv.listen(port, host, () => srv.close(() => resolve(true)));
  });
}

/** Resolves an ephemeral free port on 127.0.0.1. */
export function freePort() {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

export const isRoot = () => typeof process.getuid === 'function' && process.getuid() === 0;

export function lastLines(text, n = 3) {
  return text.trim().split('\n').slice(-n).join(' | ');
}

/** Waits until the web server answers its health check (or exits, or 60 s pass). */
export async function waitForHealth(url, web) {
  const deadline = Date.now() + 60_000;
  let last = '';
  while (Date.now() < deadline) {
    if (web && (web.exitCode !== null || web.signalCode !== null)) fail(`the web server ${describeExit(web.exitCode, web.signalCode)} before it was healthy`);
    try {
      const r = await fetch(url);
      if (r.ok) return;
      last = await r.text();
    } catch (e) {
      last = e.message;
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  fail(`the web server did not become healthy within 60 s (${last})`);
}

/** How a child process ended, in words: "exited with code 1", "was stopped by signal SIGKILL (…)". */
export function describeExit(code, signal) {
  if (signal === 'SIGKILL') return 'was killed (signal SIGKILL: from outside, often the kernel\'s out-of-memory killer; see `dmesg`)';
  if (signal) return `was stopped by signal ${signal}`;
  if (code === 0) return 'exited (code 0) although nothing asked it to stop';
  return `exited with code ${code}`;
}

/**
 * Passes a child's stdout (unless `quiet`) and stderr through to ours and keeps the last `n` lines
 * of both (colour codes removed), so that when it dies we can say what it printed last. Returns a
 * function that gives those lines.
 */
export function keepLastLines(child, { n = 15, quiet = false } = {}) {
  const lines = [];
  const partial = new Map();
  const take = (stream, target) => {
    partial.set(stream, '');
    stream.on('data', (chunk) => {
      target.write(chunk);
      const parts = (partial.get(stream) + chunk.toString('utf8')).split('\n');
      partial.set(stream, parts.pop().slice(-2000));
      lines.push(...parts);
      if (lines.length > n) lines.splice(0, lines.length - n);
    });
  };
  if (child.stdout) take(child.stdout, quiet ? { write() {} } : process.stdout);
  if (child.stderr) take(child.stderr, process.stderr);
  const plain = (l) => l.replace(/\x1b\[[0-9;]*[A-Za-z]/g, '').trimEnd();
  return () => [...lines, ...partial.values()].map(plain).filter(Boolean).slice(-n);
}

/**
 * Watches the web server (spawned with its stdout and stderr piped): passes its output on, and
 * when it ends without having been asked to, prints why (exit code or signal) and its last lines
 * of output, then calls `after(status)` with a non-zero exit status for this process.
 * `expectExit()` marks the stops we cause (Ctrl-C, the end of the tests). `quiet` keeps its
 * stdout off our screen (it is still kept for the report).
 */
export function watchWebServer(web, after, { quiet = false } = {}) {
  let expected = false;
  const recent = keepLastLines(web, { quiet });
  web.on('exit', (code, signal) => {
    if (expected) return;
    const tail = recent();
    console.error(`\n\x1b[31m✖ the web server ${describeExit(code, signal)}\x1b[0m`);
    if (tail.length) console.error(`  its last output:\n${tail.map((l) => `  │ ${l}`).join('\n')}`);
    after(code ? code : signal ? 128 + (osSignals[signal] ?? 0) : 1);
  });
  return { expectExit: () => (expected = true) };
}

/** Things to stop, last started first; `stopAll()` keeps going when one of them fails. */
export function stopper(first) {
  const stops = first ? [first] : [];
  return {
    push: (fn) => stops.push(fn),
    stopAll() {
      while (stops.length) {
        try {
          stops.pop()();
        } catch {
          /* keep stopping the rest */
        }
      }
    },
  };
}

/** Runs a lifecycle script: a SetupError becomes one red line and exit 1. */
export function runMain(main) {
  main().catch((e) => {
    if (e instanceof SetupError) {
      console.error(`\x1b[31m✖ ${e.message}\x1b[0m`);
      process.exit(1);
    }
    console.error(e);
    process.exit(1);
  });
}

/**
 * How many web processes one instance runs (scripts/serve.mjs --processes): EMBERLINE_WEB_PROCESSES,
 * else one per core (at most four), so `npm start` uses the whole machine for the web tier.
 */
export function webProcesses() {
  const n = Number(process.env.EMBERLINE_WEB_PROCESSES ?? Math.min(4, os.availableParallelism()));
  if (!Number.isInteger(n) || n < 1 || n > 16) fail(`EMBERLINE_WEB_PROCESSES takes a whole number from 1 to 16 (got "${process.env.EMBERLINE_WEB_PROCESSES}")`);
  return n;
}

export { spawn };
