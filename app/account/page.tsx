import { AppPage } from '../_components/app-page';
import { JsonForm } from '../_components/json-form';
import { SignOutButton } from '../_components/lab-switcher';
import { listTokens } from '../_lib/accounts/api-tokens';
import { tokenDto } from '../_lib/server/dto';
import { can } from '../_lib/labs/permissions';
import { requireViewer } from '../_lib/accounts/viewer';
import { TokenManager } from './tokens';

export const metadata = { title: 'Account' };
export const dynamic = 'force-dynamic';

export default async function AccountPage() {
  const v = await requireViewer('/account');
  const tokenLabs = v.memberships.filter((m) => can(m.role, 'token:manage')).map((m) => ({ id: m.lab.id, name: m.lab.name }));
  const tokens = tokenLabs.length ? (await listTokens(v.em, v.user)).map(tokenDto) : [];
  return (
    <AppPage viewer={v} title="Your account" lead={<span className="num">{v.user.email}</span>}>
      <div className="grid grid-cols-1 gap-6 lg:grid-cols-2">
        <section className="card p-6" aria-labelledby="units">
          <h2 id="units" className="text-lg">Units</h2>
          <p className="mt-1 text-sm text-ink-soft">Numbers are stored in SI and shown in the units you prefer.</p>
          <JsonForm
            className="mt-4"
            action="/api/me"
            method="PATCH"
            submitLabel="Save"
            onSuccess={{ refresh: true, message: 'Saved.' }}
            fields={[
              {
                name: 'unitSystem',
                label: 'Show values in',
                type: 'select',
                value: v.user.unitSystem,
                options: [
                  { value: 'si', label: 'SI: °C, L, L/min, kW' },
                  { value: 'us', label: 'US customary: °F, gal, gpm, Btu/h' },
                ],
              },
            ]}
          />
        </section>
        <section className="card p-6" aria-labelledby="pw">
          <h2 id="pw" className="text-lg">Password</h2>
          <p className="mt-1 text-sm text-ink-soft">Changing it signs you out on every other device. A password reset by e-mail also revokes your API tokens.</p>
          <JsonForm
            className="mt-4"
            action="/api/auth/password"
            submitLabel="Change password"
            onSuccess={{ refresh: true, message: 'Password changed. Other sessions have ended.', reset: true }}
            fields={[
              { name: 'currentPassword', label: 'Current password', type: 'password', autoComplete: 'current-password' },
              { name: 'newPassword', label: 'New password', type: 'password', autoComplete: 'new-password', hint: 'At least 12 characters.' },
              ...(tokens.some((t) => !t.revokedAt) ? [{ name: 'revokeTokens', label: 'Also revoke all my API tokens', type: 'checkbox' as const, required: false }] : []),
            ]}
          />
        </section>
        <section className="card p-6" aria-labelledby="sessions">
          <h2 id="sessions" className="text-lg">Sessions</h2>
          <p className="mt-1 text-sm text-ink-soft">Lost a phone at the rig? End every session of this account at once.</p>
          <div className="mt-4">
            <SignOutButton everywhere className="btn-quiet" />
          </div>
        </section>
        {tokenLabs.length ? (
          <section className="card p-6 lg:col-span-2" aria-labelledby="tokens">
            <h2 id="tokens" className="text-lg">API tokens</h2>
            <p className="mt-1 text-sm text-ink-soft">
              For scripts and data loggers: send <span className="num">Authorization: Bearer &lt;token&gt;</span>. A token acts in one lab
              with your role there until it expires (90 days unless you choose otherwise). It is shown once; we keep only its hash.
              Creating one asks for your password again.
            </p>
            <TokenManager labs={tokenLabs} initial={tokens} />
          </section>
        ) : null}
      </div>
    </AppPage>
  );
}
