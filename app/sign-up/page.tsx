import Link from 'next/link';
import { AuthCard } from '../_components/app-page';
import { JsonForm } from '../_components/json-form';
import { config } from '../_lib/server/config';

export const metadata = { title: 'Create an account' };
export const dynamic = 'force-dynamic';

export default async function SignUpPage({ searchParams }: { searchParams: Promise<{ next?: string }> }) {
  const { next } = await searchParams;
  return (
    <AuthCard title="Create an account" lead="You will own a new lab of your own; teammates join it by invitation.">
      <JsonForm
        action="/api/auth/sign-up"
        submitLabel="Create account"
        onSuccess={{ message: 'Check your inbox.', reset: true }}
        fields={[
          { name: 'name', label: 'Your name', autoComplete: 'name' },
          { name: 'email', label: 'E-mail', type: 'email', autoComplete: 'email', hint: 'We send a link to this address; the account is made when you follow it.' },
          { name: 'password', label: 'Password', type: 'password', autoComplete: 'new-password', hint: 'At least 12 characters. A few unrelated words make a strong, memorable password.' },
          { name: 'labName', label: 'Lab name (optional)', required: false, hint: 'For example the yard, club or workshop where you test.' },
          ...(typeof next === 'string' ? [{ name: 'next', label: '', type: 'hidden' as const, value: next.slice(0, 500) }] : []),
        ]}
      />
      {config.demo ? (
        <p className="mt-4 rounded-lg border border-paper-line bg-paper-deep p-3 text-sm text-ink-soft">
          Demo mode: mail is not delivered. The terminal that runs <span className="num">npm start</span> prints each message with its link.
        </p>
      ) : null}
      <p className="mt-6 text-sm text-ink-soft">
        Already have an account? <Link href="/sign-in">Sign in</Link>
      </p>
    </AuthCard>
  );
}
