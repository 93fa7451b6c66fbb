/**
 * Access to the published reference data in ../shared/reference (NIST StRD, IAPWS water tables,
 * NIST SP 811 factors). One setting, REFERENCE_DIR, names the folder; it is never copied into
 * the repository. With CI=true a missing folder fails the suite; elsewhere the tests that need
 * it are skipped with a notice that names the source.
 */
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';

export const referenceDir = path.resolve(
  process.env.REFERENCE_DIR ?? path.join(__dirname, '..', '..', '..', 'shared', 'reference'),
);

export const referenceAvailable = existsSync(referenceDir);

if (!referenceAvailable) {
  const msg = `reference data folder not found at ${referenceDir} (set REFERENCE_DIR)`;
  if (process.env.CI === 'true') throw new Error(msg);
  console.warn(`notice: ${msg}; tests against NIST StRD, IAPWS and NIST SP 811 data are skipped`);
}

/** Reads and parses one JSON file of the reference folder, e.g. `readReference('units.json')`. */
export function readReference<T = unknown>(relativePath: string): T {
  return JSON.parse(readFileSync(path.join(referenceDir, relativePath), 'utf8')) as T;
}
