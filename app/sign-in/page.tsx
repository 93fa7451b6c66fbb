import Link from 'next/link';
import { redirect } from 'next/navigation';
import { AuthCard } from '../_components/app-page';
import { JsonForm } from '../_components/json-form';
import { config } from '../_lib/server/config';
import { getViewer } from '../_lib/accounts/viewer';
import { DEMO_PASSWORD, demoUsers } from '@/fixtures/demo-lab';

export const metadata = { title: 'Sign in' };
export const dynamic = 'force-dynamic';

export default async function SignInPage() {
  if (await getViewer()) redirect('/start');
  return (
    <AuthCard title="Sign in" lead="Welcome back to the workbench.">
      <JsonForm
        action="/api/auth/sign-in"
        submitLabel="Sign in"
        onSuccess={{ redirect: '/start', refresh: true }}
        fields={[
          { name: 'email', label: 'E-mail', type: 'email', autoComplete: 'email' },
          { name: 'password', label: 'Password', type: 'password', autoComplete: 'current-password' },
        ]}
      />
      <p className="mt-6 text-sm text-ink-soft">
        <Link href="/forgot-password">Forgot your password?</Link> · New here? <Link href="/sign-up">Create an account</Link>
      </p>
      {config.demo ? (
        <div className="mt-6 rounded-lg border border-paper-line bg-paper-deep p-4 text-sm">
          <p className="font-semibold text-ink">Demo lab sign-ins</p>
          <p className="mt-1 text-ink-soft">
            Password for all: <span className="num">{DEMO_PASSWORD}</span>
          </p>
          <ul className="mt-2 space-y-0.5">
            {demoUsers.map((u) => (
              <li key={u.email} className="flex justify-between gap-2">
                <span className="num text-ink">{u.email}</span>
                <span className="text-ink-muted">{u.role}</span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </AuthCard>
  );
}
