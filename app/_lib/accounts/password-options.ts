import type { Options } from '@node-rs/argon2';

/** argon2id with the OWASP minimum (m = 19 MiB, t = 2, p = 1); about 64 ms here. */
export const ARGON2_OPTIONS: Options = { algorithm: 2, memoryCost: 19456, timeCost: 2, parallelism: 1 };
