import { confirmSignUp } from '@/app/_lib/accounts/accounts';
import { signedIn } from '@/app/_lib/accounts/auth-responses';
import { route } from '@/app/_lib/server/route';
import { signUpConfirmInput } from '@/app/_lib/accounts/schemas';

/** POST: the token of a sign-up link → the account and its first lab, signed in (single use, 24 hours). */
export const POST = route({ auth: 'public' }, async (ctx) => {
  const { token } = await ctx.json(signUpConfirmInput);
  const { user, next } = await confirmSignUp(ctx.em, token, ctx.ip);
  return signedIn(ctx.em, user, ctx.req.headers.get('user-agent') ?? '', 201, { next: next || '/rigs' });
});
