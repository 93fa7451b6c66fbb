import { isUuid } from '@/app/_lib/labs/load-in-lab';
import { revokeToken } from '@/app/_lib/accounts/api-tokens';
import { tokenDto } from '@/app/_lib/server/dto';
import { notFound } from '@/app/_lib/server/errors';
import { json, route } from '@/app/_lib/server/route';

/** DELETE: revoke one of the user's tokens. */
export const DELETE = route<{ tokenId: string }>({ auth: 'session' }, async (ctx) => {
  if (!isUuid(ctx.params.tokenId)) throw notFound();
  const t = await revokeToken(ctx.em, ctx.requireActor().user, ctx.params.tokenId, ctx.ip);
  return json({ token: tokenDto(t) });
});
