// Prints the demo sign-ins. The list is read from fixtures/demo-lab.ts's plain constants.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { root } from './util.mjs';

export function demoAccounts() {
  const src = readFileSync(path.join(root, 'fixtures', 'demo-lab.ts'), 'utf8');
  const password = /DEMO_PASSWORD = '([^']+)'/.exec(src)[1];
  const users = [...src.matchAll(/\{ email: '([^']+)', name: '[^']+', role: '(\w+)'/g)].map((m) => ({ email: m[1], role: m[2] }));
  return { password, users };
}

export function printDemoSignIns() {
  const { password, users } = demoAccounts();
  console.log('Demo sign-ins (password for all: ' + password + '):');
  for (const u of users) console.log(`  ${u.role.padEnd(9)} ${u.email}`);
}
