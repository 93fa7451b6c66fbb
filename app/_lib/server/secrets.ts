import 'server-only';
import { createHash, randomBytes } from 'node:crypto';

/** A random URL-safe secret with a recognisable prefix (e.g. "emb_"), and its SHA-256 for storage. */
export function newSecret(prefix: string, bytes = 32): { token: string; hash: string } {
  const token = prefix + randomBytes(bytes).toString('base64url');
  return { token, hash: sha256(token) };
}

export const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');
