import { SiteHeader } from '../../_components/site-header';
import { ACTIONS, ROLE_SUMMARIES, can, type Action, ROLES } from '../../_lib/labs/permissions';

export const metadata = { title: 'Roles and permissions' };

/** The permissions table exactly as the server enforces it (rendered from app/_lib/labs/permissions.ts). */
export default function PermissionsHelp() {
  const actions = Object.keys(ACTIONS) as Action[];
  return (
    <>
      <SiteHeader />
      <main id="main" className="mx-auto max-w-page px-4 pb-16 pt-8">
        <h1 className="text-2xl">Roles and permissions</h1>
        <p className="mt-2 max-w-3xl text-ink-soft">
          Every lab has owners, engineers, reviewers and viewers. This table is the one the server checks on every request; a
          member of another lab sees nothing of this one.
        </p>
        <dl className="mt-6 grid gap-3 sm:grid-cols-2">
          {ROLES.map((r) => (
            <div key={r} className="card p-4">
              <dt className="font-semibold capitalize text-ink">{r}</dt>
              <dd className="mt-1 text-sm text-ink-soft">{ROLE_SUMMARIES[r]}</dd>
            </div>
          ))}
        </dl>
        <div className="card mt-6 overflow-x-auto" tabIndex={0}>
          <table className="data-table">
            <caption className="sr-only">What each role may do</caption>
            <thead>
              <tr>
                <th scope="col">Action</th>
                {ROLES.map((r) => (
                  <th key={r} scope="col" className="text-center capitalize">
                    {r}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {actions.map((a) => (
                <tr key={a}>
                  <th scope="row" className="bg-white font-normal text-ink">
                    {ACTIONS[a].label} <span className="num ml-1 text-xs text-ink-muted">{a}</span>
                  </th>
                  {ROLES.map((r) => (
                    <td key={r} className="text-center">
                      {can(r, a) ? <span aria-label="allowed" className="font-semibold text-ok-text">✓</span> : <span aria-label="not allowed" className="text-ink-muted">—</span>}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </main>
    </>
  );
}
