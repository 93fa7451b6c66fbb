// Packages: npm ci when node_modules is missing or older than the lock file; Debian packages on demand.
import { existsSync, statSync, writeFileSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import { root, run, runVisible, step, fail, isRoot } from './util.mjs';

export function ensureNodeModules() {
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  const lock = path.join(root, 'package-lock.json');
  if (existsSync(marker) && statSync(marker).mtimeMs >= statSync(lock).mtimeMs) return false;
  step('installing packages (npm ci)');
  runVisible('npm', ['ci', '--no-audit', '--no-fund'], 'npm ci failed: check the npm registry is reachable, then run npm start again');
  return true;
}

/** Installs Debian packages with apt-get (as root, or through passwordless sudo). */
export function aptInstall(packages, why) {
  if (!isRoot() && run('sudo', ['-n', 'true']).status !== 0) {
    fail(`${why}: ${packages.join(' ')} is missing and installing it needs root; run: sudo apt-get install -y ${packages.join(' ')}`);
  }
  const [cmd, ...pre] = isRoot() ? ['apt-get'] : ['sudo', '-n', 'apt-get'];
  const opts = { env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }, stdio: 'inherit' };
  step(`installing ${packages.join(' ')} from Debian's packages (${why})`);
  const install = () => run(cmd, [...pre, 'install', '-y', '--no-install-recommends', ...packages], opts).status === 0;
  if (install()) return;
  run(cmd, [...pre, 'update'], opts);
  if (!install()) {
    fail(`could not install ${packages.join(' ')} from Debian's packages (is apt's network reachable?); install it by hand and run again`);
  }
}

/** Debian must not create and start its own cluster on 5432 when we install the server. */
export function preventDebianDefaultCluster() {
  const dir = '/etc/postgresql-common/createcluster.d';
  try {
    mkdirSync(dir, { recursive: true });
    writeFileSync(path.join(dir, 'emberline.conf'), 'create_main_cluster = false\n');
  } catch {
    /* without root apt-get goes through sudo and may create the default cluster; harmless */
  }
}

export function ensureChromium() {
  const bin = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
  if (existsSync(bin)) return bin;
  aptInstall(['chromium'], 'the browser tests drive headless Chromium');
  if (!existsSync(bin)) fail(`chromium was installed but ${bin} is missing; set CHROMIUM_PATH`);
  return bin;
}
