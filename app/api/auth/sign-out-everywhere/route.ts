import { endAllSessions } from '@/app/_lib/accounts';
import { audit } from '@/app/_lib/audit';
import { signedOut } from '@/app/_lib/auth-responses';
import { route } from '@/app/_lib/route';

/** POST: end every session of the account, on every device. */
export const POST = route({ auth: 'session' }, async (ctx) => {
  const { user } = ctx.requireActor();
  await endAllSessions(ctx.em, user);
  await audit(ctx.em, { kind: 'sign-out-everywhere', actor: user, subject: user.email, ip: ctx.ip });
  return signedOut();
});
