// @ts-check
/** @type {import('next').NextConfig} */
const nextConfig = {
  poweredByHeader: false,
  // The build type-checks the app's own sources; test/typecheck.test.ts checks everything else.
  typescript: { tsconfigPath: 'tsconfig.build.json' },
  reactStrictMode: true,
  // Server-only packages with native code or dynamic requires stay outside the bundle.
  serverExternalPackages: [
    '@mikro-orm/core', '@mikro-orm/knex', '@mikro-orm/postgresql', '@mikro-orm/migrations', 'knex', 'pg',
    'pg-boss', 'pg-copy-streams', '@node-rs/argon2', 'nodemailer', 'exceljs', 'linkedom',
    // the analysis pool starts its workers from piscina's own files (app/_lib/server/analysis-pool.ts)
    'piscina',
  ],
  experimental: { serverActions: { bodySizeLimit: '1mb' } },
};
module.exports = nextConfig;
