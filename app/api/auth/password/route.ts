import { changePassword } from '@/app/_lib/accounts/accounts';
import { signedIn } from '@/app/_lib/accounts/auth-responses';
import { route } from '@/app/_lib/server/route';
import { changePasswordInput } from '@/app/_lib/accounts/schemas';

/** POST: change the password; every other session ends (and with `revokeTokens` every API token), this browser gets a new one. */
export const POST = route({ auth: 'session' }, async (ctx) => {
  const { user } = ctx.requireActor();
  const { currentPassword, newPassword, revokeTokens } = await ctx.json(changePasswordInput);
  const { tokensRevoked } = await changePassword(ctx.em, user, currentPassword, newPassword, ctx.ip, revokeTokens);
  return signedIn(ctx.em, user, ctx.req.headers.get('user-agent') ?? '', 200, { tokensRevoked });
});
