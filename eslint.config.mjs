// ESLint (flat config): the Next.js rules (core web vitals, React, hooks, accessibility) and the
// typescript-eslint recommended rules. `npm run lint`; `npm test` runs it before the suites.
import { defineConfig, globalIgnores } from 'eslint/config';
import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTypescript from 'eslint-config-next/typescript';

export default defineConfig([
  ...nextVitals,
  ...nextTypescript,
  {
    rules: {
      // unused names are errors, except the `_name` convention for deliberately unused ones
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none', ignoreRestSiblings: true }],
    },
  },
  {
    // tests read JSON answers of any shape
    files: ['test/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  globalIgnores(['.next/**', 'node_modules/**', '.data/**', 'test-results/**', 'bench/out/**', 'next-env.d.ts', 'entities/migrations/**']),
]);
