// A small loopback load balancer for `npm start -- --instances N`: round robin over the web
// instances, each request to the next one that is up. It adds the client's socket address to
// X-Forwarded-For (the instances believe one hop: TRUST_PROXY_HOPS=1), as a real load balancer
// does. An instance that refuses a connection is left out for a few seconds; a request that finds
// no instance gets 502. For local use only: a real deployment puts its own load balancer here.
import http from 'node:http';

const DOWN_MS = 3_000;
// hop-by-hop headers (RFC 9110 §7.6.1) belong to one connection: each side sets its own
const HOP = new Set(['connection', 'keep-alive', 'proxy-connection', 'transfer-encoding', 'upgrade', 'te', 'trailer']);
const endToEnd = (raw) => {
  const out = [];
  for (let i = 0; i < raw.length; i += 2) if (!HOP.has(raw[i].toLowerCase())) out.push(raw[i], raw[i + 1]);
  return out;
};

/**
 * @param {{ host: string, port: number, targets: { host: string, port: number }[] }} opts
 * @returns {Promise<http.Server>}
 */
export function startProxy({ host, port, targets }) {
  const agent = new http.Agent({ keepAlive: true, maxSockets: 256 });
  const downUntil = new Map();
  let next = 0;
  const pick = () => {
    for (let i = 0; i < targets.length; i++) {
      const t = targets[(next + i) % targets.length];
      if ((downUntil.get(t) ?? 0) <= Date.now()) {
        next = (next + i + 1) % targets.length;
        return t;
      }
    }
    return null;
  };
  const server = http.createServer((req, res) => {
    const target = pick();
    if (!target) {
      res.writeHead(502, { 'content-type': 'text/plain' }).end('No web instance is up.\n');
      return;
    }
    const peer = req.socket.remoteAddress ?? '';
    const xff = req.headers['x-forwarded-for'];
    const headers = Object.fromEntries(Object.entries(req.headers).filter(([k]) => !HOP.has(k)));
    headers['x-forwarded-for'] = xff ? `${xff}, ${peer}` : peer;
    const up = http.request({ host: target.host, port: target.port, method: req.method, path: req.url, headers, agent }, (r) => {
      res.writeHead(r.statusCode ?? 502, endToEnd(r.rawHeaders));
      r.pipe(res);
    });
    up.on('error', (e) => {
      if (e.code === 'ECONNREFUSED' || e.code === 'ECONNRESET') downUntil.set(target, Date.now() + DOWN_MS);
      if (!res.headersSent) res.writeHead(502, { 'content-type': 'text/plain' }).end('The web instance did not answer.\n');
      else res.destroy();
    });
    req.pipe(up);
  });
  server.keepAliveTimeout = 65_000;
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve(server));
  });
}
