import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { audit } from '@/app/_lib/labs/audit';
import { json, route } from '@/app/_lib/server/route';
import { shareDto } from '@/app/_lib/studies/studies';

/** DELETE: revoke a share link at once. */
export const DELETE = route<{ shareId: string }>({ auth: 'session' }, async (ctx) => {
  const { row: link } = await loadInLab(ctx, 'share', ctx.params.shareId, 'share:manage');
  if (!link.revokedAt) {
    link.revokedAt = new Date();
    await audit(ctx.em, { kind: 'share-revoked', actor: ctx.requireActor().user, lab: link.lab, subject: `share link ${link.id} of study ${link.study.id}`, ip: ctx.ip }, false);
  }
  await ctx.em.flush();
  return json({ share: shareDto(link) });
});
