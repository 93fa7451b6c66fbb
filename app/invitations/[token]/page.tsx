import Link from 'next/link';
import { AuthCard } from '../../_components/app-page';
import { AcceptInvitation } from './accept';
import { getEm } from '../../_lib/server/db';
import { findInvitation, invitationProblem } from '../../_lib/labs/labs';
import { getViewer } from '../../_lib/accounts/viewer';

export const metadata = { title: 'Invitation' };
export const dynamic = 'force-dynamic';

export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const viewer = await getViewer();
  const inv = await findInvitation(await getEm(), token);
  const problem = invitationProblem(inv, viewer?.user ?? null);
  if (problem || !inv) {
    return (
      <AuthCard title="This invitation cannot be used">
        <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">
          {problem}
        </p>
        <p className="mt-4 text-sm text-ink-soft">Ask the lab owner to send a new invitation to your address.</p>
      </AuthCard>
    );
  }
  const here = `/invitations/${encodeURIComponent(token)}`;
  return (
    <AuthCard
      title={`Join ${inv.lab.name}`}
      lead={
        <>
          {inv.invitedBy?.name ?? 'An owner'} invites <strong>{inv.email}</strong> to this lab as <strong>{inv.role}</strong>.
        </>
      }
    >
      {viewer ? (
        <AcceptInvitation token={token} />
      ) : (
        <div className="space-y-3">
          <p className="text-ink-soft">Sign in as {inv.email} to accept, or create an account with that address first.</p>
          <div className="flex flex-wrap gap-2">
            <Link className="btn-primary" href={`/sign-in?next=${encodeURIComponent(here)}`}>
              Sign in
            </Link>
            <Link className="btn-quiet" href={`/sign-up?next=${encodeURIComponent(here)}`}>
              Create an account
            </Link>
          </div>
        </div>
      )}
    </AuthCard>
  );
}
