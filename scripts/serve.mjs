#!/usr/bin/env node
// The web server: Next.js in this process behind a plain node:http server, so that the app learns
// the socket's peer address. Next.js itself copies a client's own X-Forwarded-For when one is
// sent (it only fills the header when it is absent), so without a proxy that header is the
// client's word. This server sets `x-emberline-peer` from the socket on every request (replacing
// whatever a client sent under that name) and marks the process, so the app trusts that header
// only when it runs here (app/_lib/server/client-address.ts). Behind a load balancer, set
// TRUST_PROXY_HOPS instead; plain `next start` then works as well.
//
//   node scripts/serve.mjs [-H host] [-p port] [--dev]
import { createServer } from 'node:http';
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
server.listen(port, hostname, () => console.log(`web server on http://${hostname}:${port}`));

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
