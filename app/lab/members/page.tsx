import { AppPage } from '../../_components/app-page';
import { JsonForm } from '../../_components/json-form';
import { invitationDto, memberDto } from '../../_lib/server/dto';
import { ROLE_SUMMARIES, ROLES } from '../../_lib/labs/permissions';
import { invitationsOf, membersOf } from '../../_lib/labs/labs';
import { requireLabAction } from '../../_lib/accounts/viewer';
import { MemberRow } from './member-row';

export const metadata = { title: 'Members' };
export const dynamic = 'force-dynamic';

const dateFmt = (iso: string) => new Date(iso).toLocaleDateString('en-GB', { dateStyle: 'medium', timeZone: 'UTC' });

export default async function MembersPage() {
  const v = await requireLabAction('/lab/members', 'lab:read');
  const lab = v.current.lab;
  const manage = v.can('member:manage');
  const members = (await membersOf(v.em, lab)).map(memberDto);
  const invitations = manage
    ? (await invitationsOf(v.em, lab, { open: true })).map(invitationDto)
    : [];
  const roleOptions = ROLES.map((r) => ({ value: r, label: `${r} — ${ROLE_SUMMARIES[r]}` }));
  return (
    <AppPage viewer={v} title="Members" lead={`Who works in ${lab.name}, and in which role.`}>
      <div className="grid gap-6 lg:grid-cols-[1.6fr_1fr]">
        <section className="card relative overflow-x-auto p-0" aria-labelledby="members-h" tabIndex={0}>
          <h2 id="members-h" className="px-5 pt-4 text-lg">People</h2>
          <table className="data-table mt-2">
            <thead>
              <tr>
                <th scope="col">Name</th>
                <th scope="col">E-mail</th>
                <th scope="col">Role</th>
                {manage ? <th scope="col"><span className="sr-only">Actions</span></th> : null}
              </tr>
            </thead>
            <tbody>
              {members.map((m) => (
                <MemberRow key={m.id} labId={lab.id} member={m} manage={manage} self={m.user.id === v.user.id} />
              ))}
            </tbody>
          </table>
        </section>
        {manage ? (
          <section className="card p-6" aria-labelledby="invite-h">
            <h2 id="invite-h" className="text-lg">Invite someone</h2>
            <p className="mt-1 text-sm text-ink-soft">The link goes to that address only, works once and expires in 7 days.</p>
            <JsonForm
              className="mt-4"
              action={`/api/labs/${lab.id}/invitations`}
              submitLabel="Send invitation"
              onSuccess={{ refresh: true, reset: true, message: 'Invitation sent.' }}
              fields={[
                { name: 'email', label: 'E-mail', type: 'email', autoComplete: 'off' },
                { name: 'role', label: 'Role', type: 'select', value: 'engineer', options: roleOptions },
              ]}
            />
            {invitations.length ? (
              <>
                <h3 className="mt-6 text-base">Pending invitations</h3>
                <ul className="mt-2 space-y-1 text-sm">
                  {invitations.map((i) => (
                    <li key={i.id} className="flex justify-between gap-2">
                      <span className="num">{i.email}</span>
                      <span className="text-ink-muted">
                        {i.role} · until {dateFmt(i.expiresAt)}
                      </span>
                    </li>
                  ))}
                </ul>
              </>
            ) : null}
          </section>
        ) : (
          <section className="card p-6 text-sm text-ink-soft">
            <h2 className="text-lg text-ink">Your role: {v.current.role}</h2>
            <p className="mt-2">{ROLE_SUMMARIES[v.current.role]}</p>
            <p className="mt-2">Owners invite members and change roles.</p>
          </section>
        )}
      </div>
    </AppPage>
  );
}
