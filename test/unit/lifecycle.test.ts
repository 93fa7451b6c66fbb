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

describe('a web server that dies says why', () => {
  // The watcher of scripts/lib/util.mjs, as npm start and npm test use it, over a stand-in server
  // (a node process that prints and then ends the way a real one can). Exit statuses follow the
  // POSIX shell convention 128 + signal number (SIGKILL is 9: common practice).
  const watched = (childCode: string, expect = false) => {
    const script = `
      import { spawn } from 'node:child_process';
      import { watchWebServer } from ${JSON.stringify(path.join(root, 'scripts/lib/util.mjs'))};
      const web = spawn(process.execPath, ['-e', ${JSON.stringify(childCode)}], { stdio: ['ignore', 'pipe', 'pipe'] });
      const watch = watchWebServer(web, (status) => process.exit(status));
      ${expect ? "setTimeout(() => { watch.expectExit(); web.kill('SIGTERM'); }, 200); web.on('exit', () => process.exit(0));" : ''}
    `;
    return spawnSync(process.execPath, ['--input-type=module', '-e', script], { cwd: root, encoding: 'utf8', timeout: 20_000 });
  };

  test('killed by a signal: the signal, a hint, and its last lines of output', () => {
    const r = watched("console.log('\\x1b[32mready\\x1b[0m'); console.error('allocating a lot'); setTimeout(() => process.kill(process.pid, 'SIGKILL'), 50);");
    expect(r.status).toBe(128 + 9);
    expect(r.stdout).toContain('ready'); // its output is still shown as it comes
    expect(r.stderr).toMatch(/the web server was killed \(signal SIGKILL: .*out-of-memory/);
    expect(r.stderr).toMatch(/its last output:\n {2}│ ready\n {2}│ allocating a lot/);
  });

  test('an exit code of its own, passed on as ours', () => {
    const r = watched("console.error('Error: could not load the build'); process.exit(3);");
    expect(r.status).toBe(3);
    expect(r.stderr).toMatch(/the web server exited with code 3/);
    expect(r.stderr).toContain('│ Error: could not load the build');
  });

  test('ending with code 0 unasked is still reported, and exits non-zero', () => {
    const r = watched('process.exit(0);');
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/exited \(code 0\) although nothing asked it to stop/);
  });

  test('a stop we asked for is not reported', () => {
    const r = watched("process.on('SIGTERM', () => process.exit(0)); setInterval(() => {}, 1000);", true);
    expect(r.status).toBe(0);
    expect(r.stderr).not.toMatch(/the web server/);
  });
});
