import { resetPassword } from '@/app/_lib/accounts/accounts';
import { signedIn } from '@/app/_lib/accounts/auth-responses';
import { route } from '@/app/_lib/server/route';
import { resetInput } from '@/app/_lib/accounts/schemas';

/** POST: use a reset token (single use, one hour); ends other sessions and signs in here. */
export const POST = route({ auth: 'public' }, async (ctx) => {
  const { token, password } = await ctx.json(resetInput);
  const user = await resetPassword(ctx.em, token, password, ctx.ip);
  return signedIn(ctx.em, user, ctx.req.headers.get('user-agent') ?? '');
});
