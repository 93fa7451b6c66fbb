import { AppPage } from '../../_components/app-page';
import { auditDto } from '../../_lib/server/dto';
import { requireLabAction } from '../../_lib/accounts/viewer';
import { auditOf } from '../../_lib/labs/labs';

export const metadata = { title: 'Audit log' };
export const dynamic = 'force-dynamic';

export default async function AuditPage() {
  const v = await requireLabAction('/lab/audit', 'audit:read');
  const events = (await auditOf(v.em, v.current.lab)).map(auditDto);
  return (
    <AppPage viewer={v} title="Audit log" lead="Security events of this lab: invitations, role changes, tokens. Newest first.">
      <div className="card relative overflow-x-auto" tabIndex={0}>
        <table className="data-table">
          <thead>
            <tr>
              <th scope="col">When (UTC)</th>
              <th scope="col">Event</th>
              <th scope="col">By</th>
              <th scope="col">About</th>
            </tr>
          </thead>
          <tbody>
            {events.map((e) => (
              <tr key={e.id}>
                <td className="num whitespace-nowrap">{e.at.replace('T', ' ').slice(0, 19)}</td>
                <td>{e.kind}</td>
                <td className="num">{e.actor ?? '—'}</td>
                <td>{e.subject}</td>
              </tr>
            ))}
            {events.length === 0 ? (
              <tr>
                <td colSpan={4} className="text-ink-muted">No events yet.</td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
    </AppPage>
  );
}
