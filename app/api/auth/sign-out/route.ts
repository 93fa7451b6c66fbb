import { endSession } from '@/app/_lib/accounts/session';
import { audit } from '@/app/_lib/labs/audit';
import { signedOut } from '@/app/_lib/accounts/auth-responses';
import { route } from '@/app/_lib/server/route';

/** POST: end this browser's session. */
export const POST = route({ auth: 'session' }, async (ctx) => {
  const actor = ctx.requireActor();
  await endSession(ctx.em, actor.sessionId);
  await audit(ctx.em, { kind: 'sign-out', actor: actor.user, subject: actor.user.email, ip: ctx.ip });
  return signedOut();
});
