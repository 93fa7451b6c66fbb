import pkg from '@/package.json';

/** The software that computed a result: stored with every saved fit and in every block cache key. */
export const SOFTWARE_VERSION = `emberline ${pkg.version}`;
