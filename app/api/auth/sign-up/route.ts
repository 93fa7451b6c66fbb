import { SIGN_UP_SENT, signUp } from '@/app/_lib/accounts/accounts';
import { json, route } from '@/app/_lib/server/route';
import { signUpInput } from '@/app/_lib/accounts/schemas';

/**
 * POST: start a sign-up. The answer is the same (202) whether or not the address has an account:
 * the mail to it either carries the link that makes the account or says that it exists.
 */
export const POST = route({ auth: 'public' }, async (ctx) => {
  const input = await ctx.json(signUpInput);
  await signUp(ctx.em, input, ctx.ip);
  return json({ ok: true, message: SIGN_UP_SENT(input.email) }, { status: 202 });
});
