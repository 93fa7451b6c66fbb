import { invitationDto } from '@/app/_lib/server/dto';
import { invitationsOf, invite } from '@/app/_lib/labs/labs';
import { json, route } from '@/app/_lib/server/route';
import { inviteInput } from '@/app/_lib/accounts/schemas';

type P = { labId: string };

/** GET: invitations of the lab, newest first (owners). */
export const GET = route<P>({ auth: 'session', labAction: 'member:manage' }, async (ctx) => {
  const rows = await invitationsOf(ctx.em, ctx.params.labId);
  return json({ invitations: rows.map(invitationDto) });
});

/** POST: invite an e-mail address with a role; the link is mailed, valid 7 days, single use. */
export const POST = route<P>({ auth: 'session', labAction: 'member:manage' }, async (ctx) => {
  const { email, role } = await ctx.json(inviteInput);
  const inv = await invite(ctx.em, ctx.member!.lab, ctx.requireActor().user, email, role, ctx.ip);
  return json({ invitation: invitationDto(inv) }, { status: 201 });
});
