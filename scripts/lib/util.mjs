// Small helpers shared by the lifecycle scripts. Node built-ins only: these run before `npm ci`.
import { spawnSync, spawn } from 'node:child_process';
import { createServer } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

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
    if (web && web.exitCode !== null) fail(`the web server exited with code ${web.exitCode} before it was healthy`);
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

export { spawn };
