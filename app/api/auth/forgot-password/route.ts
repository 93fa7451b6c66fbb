import { requestReset } from '@/app/_lib/accounts/accounts';
import { json, route } from '@/app/_lib/server/route';
import { forgotInput } from '@/app/_lib/accounts/schemas';

/** POST: send a reset link if the address has an account. The answer is the same either way. */
export const POST = route({ auth: 'public' }, async (ctx) => {
  const { email } = await ctx.json(forgotInput);
  await requestReset(ctx.em, email, ctx.ip);
  return json({ ok: true, message: 'If that address has an account, a reset link is on its way. It works once, for one hour.' });
});
