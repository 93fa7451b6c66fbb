import 'server-only';
import { readCapturedMail } from './mail-capture';

/** The kinds of mail a lab causes (and so may read back in demo mode). */
const LAB_KINDS = new Set(['invitation', 'review']);

/**
 * Captured messages that this lab caused (its invitations and review notices), for its owners'
 * demo-mode mail page. Account mail — a sign-up link, a password reset — goes to a person, not
 * to a lab, and is never shown here, whoever it was sent to; another lab's mail neither.
 */
export async function labMail(labId: string) {
  return (await readCapturedMail(500)).filter((m) => m.labId === labId && LAB_KINDS.has(m.kind));
}
