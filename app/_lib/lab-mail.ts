import 'server-only';
import { readCapturedMail } from './mail-capture';

/**
 * Captured messages the lab sent (invitations, review notices: `sendMail(…, { labId })`), so one
 * lab never reads another's mail. Not chosen by address: an owner who invites any address would
 * read all of its mail, reset links included.
 */
export async function labMail(labId: string) {
  return (await readCapturedMail(300)).filter((m) => m.lab === labId);
}
