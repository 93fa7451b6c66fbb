// The analysis worker thread's entry (started by app/_lib/server/analysis-pool.ts through piscina).
// The analysis code is TypeScript: tsx's require hook compiles it as it loads (once per worker, with
// tsx's cache), both under `next start` and under vitest, and resolves the `@/` paths of
// tsconfig.json. Nothing here is bundled by Next.js (piscina is a server external package).
/* eslint-disable @typescript-eslint/no-require-imports */
require('tsx/cjs/api').register();
const { runTask } = require('./tasks.ts');

module.exports = runTask;
