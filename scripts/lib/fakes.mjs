// Local fakes of hosted services, started only when the production settings are absent:
// an SMTP fake (unless SMTP_URL is set) and an S3 fake (unless S3_ENDPOINT is set). Returns the environment the web server needs and a stop().
import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { createInterface } from 'node:readline';
import { root, step, fail } from './util.mjs';

function startChild(script, env, what) {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [path.join(root, 'scripts', script)], { cwd: root, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'inherit'] });
    const timer = setTimeout(() => reject(new Error(`${what} did not start within 15 s`)), 15_000);
    createInterface({ input: child.stdout }).once('line', (line) => {
      clearTimeout(timer);
      try {
        resolve({ child, info: JSON.parse(line) });
      } catch {
        reject(new Error(`${what} said: ${line}`));
      }
    });
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`${what} exited with code ${code}`));
    });
  });
}

/** A per-checkout secret for signing sessions in demo mode, kept in .data/. */
function demoSessionSecret() {
  const file = path.join(root, '.data', 'session-secret');
  if (!existsSync(file)) {
    mkdirSync(path.dirname(file), { recursive: true });
    writeFileSync(file, randomBytes(32).toString('base64url') + '\n', { mode: 0o600 });
  }
  return readFileSync(file, 'utf8').trim();
}

/** @param {{ test?: boolean }} opts */
export async function startFakes({ test = false } = {}) {
  const env = {};
  const children = [];
  env.SESSION_SECRET = process.env.SESSION_SECRET ?? (test ? randomBytes(32).toString('base64url') : demoSessionSecret());
  if (!process.env.SMTP_URL) {
    const dir = path.join(root, '.data', test ? 'mail-test' : 'mail');
    if (test) rmSync(dir, { recursive: true, force: true });
    try {
      const { child, info } = await startChild('smtp-fake.mjs', { MAIL_CAPTURE_DIR: dir, SMTP_FAKE_PORT: test ? '0' : (process.env.SMTP_FAKE_PORT ?? '0'), MAIL_ECHO: test ? '0' : '1' }, 'the SMTP fake');
      children.push(child);
      env.SMTP_URL = `smtp://127.0.0.1:${info.port}`;
      env.MAIL_CAPTURE_DIR = dir;
      step(`local SMTP fake on 127.0.0.1:${info.port} (messages in ${path.relative(root, dir)}/${test ? '' : ', and printed here'})`);
    } catch (e) {
      fail(`could not start the local SMTP fake: ${e.message}`);
    }
  }
  if (!process.env.S3_ENDPOINT) {
    const dir = path.join(root, '.data', test ? 's3-test' : 's3');
    if (test) rmSync(dir, { recursive: true, force: true });
    try {
      const { child, info } = await startChild('s3-fake.mjs', { S3_FAKE_DIR: dir, S3_BUCKET: 'emberline' }, 'the S3 fake');
      children.push(child);
      Object.assign(env, {
        S3_ENDPOINT: `http://127.0.0.1:${info.port}`,
        S3_BUCKET: 'emberline',
        S3_REGION: 'us-east-1',
        S3_ACCESS_KEY_ID: 'S3RVER',
        S3_SECRET_ACCESS_KEY: 'S3RVER',
      });
      step(`local S3 fake on 127.0.0.1:${info.port} (objects in ${path.relative(root, dir)}/)`);
    } catch (e) {
      for (const c of children) c.kill('SIGTERM');
      fail(`could not start the local S3 fake: ${e.message}`);
    }
  }
  return {
    env,
    stop() {
      for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
    },
  };
}
