import { signUp } from '@/app/_lib/accounts';
import { signedIn } from '@/app/_lib/auth-responses';
import { route } from '@/app/_lib/route';
import { signUpInput } from '@/app/_lib/schemas';

/** POST: create an account and its first lab, then sign in. */
export const POST = route({ auth: 'public' }, async (ctx) => {
  const input = await ctx.json(signUpInput);
  const user = await signUp(ctx.em, input, ctx.ip);
  return signedIn(ctx.em, user, ctx.req.headers.get('user-agent') ?? '', ctx.secure, 201);
});
