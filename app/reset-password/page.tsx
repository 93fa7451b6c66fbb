import Link from 'next/link';
import { AuthCard } from '../_components/app-page';
import { JsonForm } from '../_components/json-form';
import { getEm } from '../_lib/server/db';
import { resetLinkProblem } from '../_lib/accounts/accounts';

export const metadata = { title: 'Choose a new password' };
export const dynamic = 'force-dynamic';

export default async function ResetPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  const em = await getEm();
  const problem = await resetLinkProblem(em, token);
  if (problem || !token) {
    return (
      <AuthCard title="This link cannot be used">
        <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">
          {problem}
        </p>
        <p className="mt-4">
          <Link className="btn-primary" href="/forgot-password">
            Ask for a new link
          </Link>
        </p>
      </AuthCard>
    );
  }
  return (
    <AuthCard title="Choose a new password" lead="Every other session of this account ends and its API tokens are revoked when you save it.">
      <JsonForm
        action="/api/auth/reset-password"
        submitLabel="Save and sign in"
        onSuccess={{ redirect: '/rigs', refresh: true }}
        fields={[
          { name: 'token', label: '', type: 'hidden', value: token },
          { name: 'password', label: 'New password', type: 'password', autoComplete: 'new-password', hint: 'At least 12 characters.' },
        ]}
      />
    </AuthCard>
  );
}
