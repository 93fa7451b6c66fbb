import 'server-only';
import { hash, verify } from '@node-rs/argon2';
import { dictionary } from '@zxcvbn-ts/language-common';
import { ARGON2_OPTIONS } from './password-options';

export const MIN_PASSWORD_LENGTH = 12;
export const MAX_PASSWORD_LENGTH = 256;

let common: Set<string> | undefined;
/** The bundled list of ~49,000 common passwords (zxcvbn-ts common dictionary, MIT). */
function commonPasswords(): Set<string> {
  common ??= new Set((dictionary['passwords-common'] as string[]).map((p) => p.toLowerCase()));
  return common;
}

/**
 * Length-based policy after NIST SP 800-63B §5.1.1: at least 12 characters, no composition
 * rules, refused when it is a known common password or built from the account's own words.
 * Returns the reason, or null when the password is acceptable.
 */
export function passwordProblem(password: string, context: { email?: string } = {}): string | null {
  if ([...password].length < MIN_PASSWORD_LENGTH) return `Use at least ${MIN_PASSWORD_LENGTH} characters; a few unrelated words work well.`;
  if (password.length > MAX_PASSWORD_LENGTH) return `Use at most ${MAX_PASSWORD_LENGTH} characters.`;
  const lower = password.toLowerCase();
  if (commonPasswords().has(lower)) return 'That password is on a list of commonly used passwords; choose another.';
  if (/^(.)\1+$/.test(password)) return 'A single repeated character is too easy to guess.';
  const local = context.email?.split('@')[0]?.toLowerCase();
  if (lower.includes('emberline') || (local && local.length >= 4 && lower.includes(local))) {
    return 'Do not build the password from your e-mail address or the name of this service.';
  }
  return null;
}

export const hashPassword = (password: string) => hash(password, ARGON2_OPTIONS);

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

/** A hash to verify against when the account does not exist, so timing does not tell. */
let dummy: Promise<string> | undefined;
export const dummyHash = () => (dummy ??= hashPassword('not-a-real-password-for-timing'));
