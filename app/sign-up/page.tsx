import Link from 'next/link';
import { AuthCard } from '../_components/app-page';
import { JsonForm } from '../_components/json-form';

export const metadata = { title: 'Create an account' };

export default function SignUpPage() {
  return (
    <AuthCard title="Create an account" lead="You will own a new lab of your own; teammates join it by invitation.">
      <JsonForm
        action="/api/auth/sign-up"
        submitLabel="Create account"
        onSuccess={{ redirect: '/rigs', refresh: true }}
        fields={[
          { name: 'name', label: 'Your name', autoComplete: 'name' },
          { name: 'email', label: 'E-mail', type: 'email', autoComplete: 'email' },
          { name: 'password', label: 'Password', type: 'password', autoComplete: 'new-password', hint: 'At least 12 characters. A few unrelated words make a strong, memorable password.' },
          { name: 'labName', label: 'Lab name (optional)', required: false, hint: 'For example the yard, club or workshop where you test.' },
        ]}
      />
      <p className="mt-6 text-sm text-ink-soft">
        Already have an account? <Link href="/sign-in">Sign in</Link>
      </p>
    </AuthCard>
  );
}
