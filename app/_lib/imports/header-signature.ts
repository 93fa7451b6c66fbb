/**
 * (Server-side: Node APIs. The 'server-only' marker sits in ./index.ts, the entry the app imports;
 * vitest cannot resolve it in leaf files until its alias in vitest.config.mts points at a file path.)
 *
 * A header signature: the normalised list of column names hashed with SHA-256, so a mapping the
 * engineer confirmed can be saved per lab and offered again when a file with the same columns
 * (in the same order) comes back. Case, surrounding spaces, inner runs of spaces and Unicode
 * compatibility forms (NFKC: `℃` → `°C`, full-width letters) do not change the signature.
 */
import { createHash } from 'node:crypto';

/**
 * @example normaliseHeaderName('  Outlet  (°F) ') // 'outlet (°f)'
 */
export function normaliseHeaderName(name: string): string {
  return name.normalize('NFKC').replace(/\s+/g, ' ').trim().toLowerCase();
}

/**
 * @returns 64 hex digits
 * @example headerSignature(['time', 'T_in [C]']) === headerSignature([' Time ', 't_in [c]']) // true
 */
export function headerSignature(header: readonly string[]): string {
  const normalised = header.map(normaliseHeaderName);
  return createHash('sha256').update(JSON.stringify(normalised), 'utf8').digest('hex');
}
