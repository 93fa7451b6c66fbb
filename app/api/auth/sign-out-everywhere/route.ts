import { endAllSessions } from '@/app/_lib/accounts/accounts';
import { audit } from '@/app/_lib/labs/audit';
import { signedOut } from '@/app/_lib/accounts/auth-responses';
import { route } from '@/app/_lib/server/route';

/** POST: end every session of the account, on every device. */
export const POST = route({ auth: 'session' }, async (ctx) => {
  const { user } = ctx.requireActor();
  await endAllSessions(ctx.em, user);
  await audit(ctx.em, { kind: 'sign-out-everywhere', actor: user, subject: user.email, ip: ctx.ip });
  return signedOut();
});
