import { createToken, listTokens } from '@/app/_lib/accounts/api-tokens';
import { tokenDto } from '@/app/_lib/server/dto';
import { json, route } from '@/app/_lib/server/route';
import { tokenInput } from '@/app/_lib/accounts/schemas';

/** GET: the user's personal API tokens (never their secrets). */
export const GET = route({ auth: 'session' }, async (ctx) => {
  const tokens = await listTokens(ctx.em, ctx.requireActor().user);
  return json({ tokens: tokens.map(tokenDto) });
});

/** POST: create a token acting in one lab with the user's role there until it expires (the current password is asked again); the secret is shown once. */
export const POST = route({ auth: 'session' }, async (ctx) => {
  const { name, labId, password, expiresInDays } = await ctx.json(tokenInput);
  const { lab } = await ctx.requireMember(labId, 'token:manage');
  const { row, token } = await createToken(ctx.em, ctx.requireActor().user, lab, { name, password, expiresInDays }, ctx.ip);
  return json({ token: tokenDto(row), secret: token }, { status: 201 });
});
