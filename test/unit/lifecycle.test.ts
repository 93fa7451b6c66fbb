import { spawnSync } from 'node:child_process';
import { createServer, type Server } from 'node:net';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';

const root = path.resolve(__dirname, '..', '..');
const start = (env: Record<string, string>) =>
  spawnSync(process.execPath, [path.join(root, 'scripts/start.mjs')], { cwd: root, encoding: 'utf8', env: { ...process.env, ...env }, timeout: 60_000 });

describe('npm start refuses bad conditions with one clear line', () => {
  let blocker: Server;
  let port: number;
  beforeAll(async () => {
    blocker = createServer();
    await new Promise<void>((r) => blocker.listen(0, '127.0.0.1', () => r()));
    port = (blocker.address() as { port: number }).port;
  });
  afterAll(() => new Promise<void>((r) => blocker.close(() => r())));

  test('a web port already taken', () => {
    const r = start({ PORT: String(port) });
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(new RegExp(`port ${port} on 127\\.0\\.0\\.1 is already taken; .*set PORT`));
  });

  test('a DATABASE_URL whose server refuses connections', async () => {
    const free = createServer();
    await new Promise<void>((r) => free.listen(0, '127.0.0.1', () => r()));
    const dead = (free.address() as { port: number }).port;
    await new Promise<void>((r) => free.close(() => r()));
    const r = start({ PORT: '0', DATABASE_URL: `postgres://nobody:x@127.0.0.1:${dead}/nothing` });
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/refused the connection .*check DATABASE_URL/);
  });
});
