import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Invitation, Membership } from '@/entities';
import { readCapturedMail } from './mail-capture';

/** Captured messages addressed to the lab's members or invitees (so one lab never reads another's mail). */
export async function labMail(em: EntityManager, labId: string) {
  const members = await em.find(Membership, { lab: labId }, { populate: ['user'] });
  const invites = await em.find(Invitation, { lab: labId });
  const addresses = new Set([...members.map((m) => m.user.email), ...invites.map((i) => i.email)]);
  return (await readCapturedMail(300)).filter((m) => m.to.some((t) => addresses.has(t.toLowerCase())));
}
