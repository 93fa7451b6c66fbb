import 'server-only';
import type { EntityManager, Loaded } from '@mikro-orm/postgresql';
import { AuditEvent, Invitation, Lab, Membership, type LabRow, type MembershipRow, type UserRow } from '@/entities';
import type { Role } from '@/entities/membership';
import { slugify } from '../accounts/accounts';
import { audit } from './audit';
import { DomainError, conflict, notFound } from '../server/errors';
import { appLink, sendMail } from '../mail/mail';
import { enforceLimits } from '../server/rate-limit';
import { newSecret, sha256 } from '../server/secrets';

const INVITATION_DAYS = 7;

/**
 * Per person per day (ours): a lab's invitations send mail to any address, so neither labs nor
 * invitations can be made without end by one account.
 */
export const DAILY_LIMITS = { labsPerUser: 5, invitationsPerUser: 50 } as const;

export async function createLab(em: EntityManager, user: UserRow, name: string, ip: string): Promise<LabRow> {
  await enforceLimits(em, [{ key: `lab-create:account:${user.id}`, max: DAILY_LIMITS.labsPerUser, windowS: 86_400 }]);
  return em.transactional(async (tx) => {
    const lab = tx.create(Lab, { name, slug: slugify(name) });
    tx.create(Membership, { user, lab, role: 'owner' });
    await audit(tx, { kind: 'lab-created', actor: user, lab, subject: name, ip }, false);
    return lab;
  });
}

export async function membershipsOf(em: EntityManager, userId: string) {
  // the memberships, then their labs by key (cheaper than the ORM's populate on this path of every
  // page; the labs join their memberships through the identity map), in the labs' name order
  const ms = await em.find(Membership, { user: userId });
  if (!ms.length) return ms as Loaded<MembershipRow, 'lab'>[];
  const labs = await em.find(Lab, { id: { $in: ms.map((m) => m.lab.id) } }, { orderBy: { name: 'asc' } });
  const order = new Map(labs.map((l, i) => [l.id, i]));
  return ms.filter((m) => order.has(m.lab.id)).sort((a, b) => order.get(a.lab.id)! - order.get(b.lab.id)!) as Loaded<MembershipRow, 'lab'>[];
}

/** Invites an address to the lab with a role and sends the link; a pending invitation to the same address is replaced. */
export async function invite(em: EntityManager, lab: LabRow, by: UserRow, emailAddr: string, role: Role, ip: string) {
  await enforceLimits(em, [
    { key: `invite:lab:${lab.id}`, max: 50, windowS: 3600 },
    { key: `invite:account:${by.id}`, max: DAILY_LIMITS.invitationsPerUser, windowS: 86_400 },
  ]);
  const existing = await em.findOne(Membership, { lab, user: { email: emailAddr } });
  if (existing) throw conflict(`${emailAddr} is already a member of this lab.`);
  const replaced = await em.nativeUpdate(Invitation, { lab, email: emailAddr, acceptedAt: null, revokedAt: null }, { revokedAt: new Date() });
  if (replaced) await audit(em, { kind: 'invitation-replaced', actor: by, lab, subject: emailAddr, ip }, false);
  const { token, hash } = newSecret('inv_');
  const invitation = em.create(Invitation, {
    lab,
    email: emailAddr,
    role,
    tokenHash: hash,
    expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000),
    invitedBy: by,
  });
  await audit(em, { kind: 'invitation-sent', actor: by, lab, subject: `${emailAddr} as ${role}`, ip });
  await sendMail(emailAddr, {
    subject: `You are invited to ${lab.name} on Emberline`,
    paragraphs: [
      `${by.name} (${by.email}) invites you to join the lab "${lab.name}" on Emberline as ${role === 'engineer' ? 'an' : 'a'} ${role}.`,
      'Emberline is a workbench for testing water heaters: trials, fitted models, pool forecasts and their review.',
      `The invitation is for ${emailAddr} only, works once and expires in ${INVITATION_DAYS} days.`,
    ],
    action: { label: 'Accept the invitation', url: appLink(`/invitations/${encodeURIComponent(token)}`) },
    footnote: 'If you did not expect this, ignore the message; nothing happens unless you accept.',
  }, { kind: 'invitation', labId: lab.id });
  return invitation;
}

/** Looks an invitation up by its token for the acceptance page (null when unknown). */
export async function findInvitation(em: EntityManager, token: string) {
  return em.findOne(Invitation, { tokenHash: sha256(token) }, { populate: ['lab', 'invitedBy'] });
}

export function invitationProblem(inv: Awaited<ReturnType<typeof findInvitation>>, user?: UserRow | null): string | null {
  if (!inv) return 'This invitation link is not valid.';
  if (inv.acceptedAt) return 'This invitation has already been used.';
  if (inv.revokedAt) return 'This invitation was withdrawn or replaced by a newer one.';
  if (inv.expiresAt <= new Date()) return 'This invitation has expired. Ask the lab owner to send a new one.';
  if (user && user.email !== inv.email) return `This invitation is for ${inv.email}, but you are signed in as ${user.email}.`;
  return null;
}

export async function acceptInvitation(em: EntityManager, token: string, user: UserRow, ip: string) {
  const inv = await findInvitation(em, token);
  const problem = invitationProblem(inv, user);
  if (problem || !inv) throw new DomainError('gone', 'invitation_invalid', problem ?? 'Invalid invitation.');
  return em.transactional(async (tx) => {
    const already = await tx.findOne(Membership, { lab: inv.lab, user });
    const membership = already ?? tx.create(Membership, { lab: inv.lab, user, role: inv.role });
    inv.acceptedAt = new Date();
    tx.persist(inv);
    await audit(tx, { kind: 'invitation-accepted', actor: user, lab: inv.lab, subject: `${user.email} as ${inv.role}`, ip }, false);
    return membership;
  });
}

async function ownerCount(em: EntityManager, labId: string) {
  return em.count(Membership, { lab: labId, role: 'owner' });
}

/** Changes a member's role; the last owner cannot stop being one. */
export async function changeRole(em: EntityManager, labId: string, memberId: string, role: Role, by: UserRow, ip: string) {
  const m = await em.findOne(Membership, { id: memberId, lab: labId }, { populate: ['user'] });
  if (!m) throw notFound('No such member in this lab.');
  if (m.role === 'owner' && role !== 'owner' && (await ownerCount(em, labId)) <= 1) {
    throw conflict('A lab needs at least one owner: make someone else an owner first.');
  }
  const before = m.role;
  m.role = role;
  await audit(em, { kind: 'role-changed', actor: by, lab: labId, subject: `${m.user.email}: ${before} → ${role}`, ip });
  return m;
}

export async function removeMember(em: EntityManager, labId: string, memberId: string, by: UserRow, ip: string) {
  const m = await em.findOne(Membership, { id: memberId, lab: labId }, { populate: ['user'] });
  if (!m) throw notFound('No such member in this lab.');
  if (m.role === 'owner' && (await ownerCount(em, labId)) <= 1) {
    throw conflict('The last owner cannot be removed: make someone else an owner first.');
  }
  em.remove(m);
  await audit(em, { kind: 'member-removed', actor: by, lab: labId, subject: m.user.email, ip });
}


/** A lab's members with their accounts, longest-standing first. */
export const membersOf = (em: EntityManager, lab: LabRow | string) => em.find(Membership, { lab }, { populate: ['user'], orderBy: { createdAt: 'asc' } });

/** A lab's invitations, newest first: all of the latest 100, or only those still open. */
export const invitationsOf = (em: EntityManager, lab: LabRow | string, opts: { open?: boolean } = {}) =>
  em.find(Invitation, { lab, ...(opts.open ? { acceptedAt: null, revokedAt: null, expiresAt: { $gt: new Date() } } : {}) }, { orderBy: { createdAt: 'desc' }, limit: 100 });

/** A lab's latest 200 security events, newest first. */
export const auditOf = (em: EntityManager, lab: LabRow | string) => em.find(AuditEvent, { lab }, { populate: ['actor'], orderBy: { createdAt: 'desc' }, limit: 200 });
