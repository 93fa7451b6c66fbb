import { signIn } from '@/app/_lib/accounts/accounts';
import { signedIn } from '@/app/_lib/accounts/auth-responses';
import { route } from '@/app/_lib/server/route';
import { signInInput } from '@/app/_lib/accounts/schemas';

/** POST: e-mail and password → session cookie. */
export const POST = route({ auth: 'public' }, async (ctx) => {
  const { email, password } = await ctx.json(signInInput);
  const user = await signIn(ctx.em, email, password, ctx.ip);
  return signedIn(ctx.em, user, ctx.req.headers.get('user-agent') ?? '');
});
