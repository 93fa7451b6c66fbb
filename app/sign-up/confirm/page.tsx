import Link from 'next/link';
import { AuthCard } from '../../_components/app-page';
import { ConfirmSignUp } from './confirm';

export const metadata = { title: 'Finish signing up' };
export const dynamic = 'force-dynamic';

/**
 * The page a sign-up link opens. Nothing happens on opening it (mail scanners open links): the
 * account is made when the person presses the button.
 */
export default async function ConfirmSignUpPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  if (!token || token.length > 200) {
    return (
      <AuthCard title="This link cannot be used">
        <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">
          This sign-up link is not complete. Open the link from the message again, or sign up anew.
        </p>
        <p className="mt-4">
          <Link className="btn-primary" href="/sign-up">
            Sign up
          </Link>
        </p>
      </AuthCard>
    );
  }
  return (
    <AuthCard title="Finish signing up" lead="One step left: create the account and sign in.">
      <ConfirmSignUp token={token} />
    </AuthCard>
  );
}
