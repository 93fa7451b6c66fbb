#!/usr/bin/env node
// The web server: Next.js in this process behind a plain node:http server, so that the app learns
// the socket's peer address. Next.js itself copies a client's own X-Forwarded-For when one is
// sent (it only fills the header when it is absent), so without a proxy that header is the
// client's word. This server sets `x-emberline-peer` from the socket on every request (replacing
// whatever a client sent under that name) and marks the process, so the app trusts that header
// only when it runs here (app/_lib/server/client-address.ts). Behind a load balancer, set
// TRUST_PROXY_HOPS instead; plain `next start` then works as well.
//
// With `--processes N` (or EMBERLINE_WEB_PROCESSES) it runs N such servers as node:cluster
// workers sharing the one port (the primary hands each new connection to the next worker), so a
// single instance uses every core of its machine for the web tier; each worker gets its share of
// the cores for its analysis threads and of the database connections. The web tier holds no
// state of its own (README, "Growing past one machine"), so the workers need nothing from each
// other. A worker that dies is replaced; one that keeps dying ends the server.
//
//   node scripts/serve.mjs [-H host] [-p port] [--dev] [--processes N]
import cluster from 'node:cluster';
import { createServer } from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import next from 'next';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const args = process.argv.slice(2);
const arg = (flag, fallback) => {
  const i = args.indexOf(flag);
  return i >= 0 && args[i + 1] ? args[i + 1] : fallback;
};
const hostname = arg('-H', process.env.HOST ?? '127.0.0.1');
const port = Number(arg('-p', process.env.PORT ?? 3000));
const dev = args.includes('--dev');
const processes = Number(arg('--processes', process.env.EMBERLINE_WEB_PROCESSES ?? 1));
if (!Number.isInteger(processes) || processes < 1 || processes > 16) {
  console.error(`web server: --processes takes a whole number from 1 to 16 (got "${arg('--processes', process.env.EMBERLINE_WEB_PROCESSES)}")`);
  process.exit(2);
}

if (processes > 1 && !dev && cluster.isPrimary) await primary();
else await serve();

/** The cluster's primary: forks the workers, replaces one that dies, stops them all on a signal. */
async function primary() {
  const cores = os.availableParallelism();
  const env = {
    EMBERLINE_WEB_PROCESSES: '1',
    // the cores shared out between the workers' analysis threads (app/_lib/server/analysis-pool.ts)
    EMBERLINE_ANALYSIS_THREADS: process.env.EMBERLINE_ANALYSIS_THREADS ?? String(Math.max(1, Math.floor(cores / processes))),
    // the ORM's connections shared out too (mikro-orm.config.ts; its default is 10 for one process)
    DATABASE_POOL_MAX: process.env.DATABASE_POOL_MAX ?? String(Math.max(4, Math.ceil(12 / processes))),
  };
  let stopping = false;
  const deaths = [];
  const fork = () => cluster.fork(env);
  let listening = 0;
  cluster.on('listening', () => {
    if (++listening === processes) console.log(`web server on http://${hostname}:${port} (${processes} processes)`);
  });
  cluster.on('exit', (worker, code, signal) => {
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      return;
    }
    const now = Date.now();
    deaths.push(now);
    while (deaths.length && now - deaths[0] > 60_000) deaths.shift();
    console.error(`web server: worker ${worker.process.pid} ended with ${signal ?? `code ${code}`}`);
    if (deaths.length >= 5) {
      console.error('web server: five workers ended within a minute; stopping');
      stopping = true;
      for (const w of Object.values(cluster.workers ?? {})) w?.kill('SIGTERM');
      setTimeout(() => process.exit(1), 5_000).unref();
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(1);
      return;
    }
    fork();
  });
  for (let i = 0; i < processes; i++) fork();
  for (const signal of ['SIGTERM', 'SIGINT']) {
    process.on(signal, () => {
      if (stopping) return;
      stopping = true;
      for (const w of Object.values(cluster.workers ?? {})) w?.kill('SIGTERM');
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      setTimeout(() => process.exit(0), 8_000).unref();
    });
  }
}

/** One web server: Next.js behind node:http (a cluster worker, or the whole server). */
async function serve() {
  globalThis[Symbol.for('emberline.peerHeader')] = 'x-emberline-peer';
  // The AWS SDK (v3) prints, at the first S3 client on Node < 22, that its releases after the first
  // week of January 2027 will need Node 22. Our version is pinned exactly (package.json) and supports
  // Node 20, so the notice says nothing about the code that runs; this switch silences that notice
  // only (the SDK reads it in emitWarningIfUnsupportedVersion and nothing else). Node 22 is the way
  // on: DEVELOPERS.md, "Node 20 and the pins that hold it". Set it to anything else to see it.
  process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';
  process.env.PORT = String(port);

  const app = next({ dev, dir: root, hostname, port, quiet: !dev });
  const handle = app.getRequestHandler();
  await app.prepare();

  const server = createServer((req, res) => {
    req.headers['x-emberline-peer'] = req.socket.remoteAddress ?? '';
    handle(req, res).catch((e) => {
      console.error(e);
      if (!res.headersSent) res.writeHead(500).end();
    });
  });
  if (dev) server.on('upgrade', (req, socket, head) => app.getUpgradeHandler()(req, socket, head));
  // Longer than a typical load balancer's idle timeout, as `next start` sets it.
  server.keepAliveTimeout = 65_000;
  server.on('error', (e) => {
    console.error(`web server: cannot serve on ${hostname}:${port}: ${e.message}`);
    process.exit(1);
  });
  server.listen(port, hostname, () => {
    if (cluster.isPrimary) console.log(`web server on http://${hostname}:${port}`);
  });

  let stopping = false;
  for (const signal of ['SIGTERM', 'SIGINT']) {
    process.on(signal, () => {
      if (stopping) return;
      stopping = true;
      server.close(() => process.exit(0));
      server.closeIdleConnections?.();
      setTimeout(() => process.exit(0), 5_000).unref();
    });
  }
}
