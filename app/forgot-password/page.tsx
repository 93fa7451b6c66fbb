import Link from 'next/link';
import { AuthCard } from '../_components/app-page';
import { JsonForm } from '../_components/json-form';

export const metadata = { title: 'Reset your password' };

export default function ForgotPasswordPage() {
  return (
    <AuthCard title="Reset your password" lead="We will e-mail a link that works once, for one hour.">
      <JsonForm
        action="/api/auth/forgot-password"
        submitLabel="Send the link"
        onSuccess={{ message: 'If that address has an account, a reset link is on its way.', reset: true }}
        fields={[{ name: 'email', label: 'E-mail', type: 'email', autoComplete: 'email' }]}
      />
      <p className="mt-6 text-sm text-ink-soft">
        <Link href="/sign-in">Back to sign in</Link>
      </p>
    </AuthCard>
  );
}
