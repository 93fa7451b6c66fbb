import { readFileSync } from 'node:fs';
import path from 'node:path';

export const fixturesDir = path.resolve(__dirname, '..', '..', '..', 'fixtures', 'import');

/** A committed fixture's bytes (see fixtures/import/README.md). */
export function fixture(name: string): Buffer {
  return readFileSync(path.join(fixturesDir, name));
}

/** Yields `bytes` in pieces of `size` bytes, like a network upload. */
export async function* chunked(bytes: Uint8Array, size: number): AsyncGenerator<Uint8Array> {
  for (let i = 0; i < bytes.length; i += size) yield bytes.subarray(i, i + size);
}

/** Runs `fn` and returns the ImportError it throws (fails the test when it does not throw one). */
export async function importErrorOf(fn: () => unknown): Promise<{ code: string; message: string; where: Record<string, unknown> }> {
  try {
    await fn();
  } catch (e) {
    if (e instanceof Error && e.name === 'ImportError') return e as unknown as { code: string; message: string; where: Record<string, unknown> };
    throw e;
  }
  throw new Error('expected an ImportError, nothing was thrown');
}
