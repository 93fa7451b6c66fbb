import Link from 'next/link';
import { AppPage } from '../_components/app-page';
import { StateBadge } from '../_components/review-panel';
import { modelLabel } from '../_lib/fits/fit-analysis';
import { collectorModelLabel } from '../_lib/fits/collector-analysis';
import { requireLabAction } from '../_lib/accounts/viewer';
import { fitsOfLab } from '../_lib/fits/fits';

export const metadata = { title: 'Fits' };
export const dynamic = 'force-dynamic';

export default async function FitsPage() {
  const v = await requireLabAction('/fits', 'lab:read');
  const fits = await fitsOfLab(v.em, v.current.lab);
  return (
    <AppPage viewer={v} title="Fits" lead="Saved fits of this lab: each records its trials, model, settings and results, and goes through review.">
      {fits.length ? (
        <div className="card relative overflow-x-auto" tabIndex={0}>
          <table className="data-table">
            <thead>
              <tr>
                <th scope="col">Fit</th>
                <th scope="col">Rig</th>
                <th scope="col">Model</th>
                <th scope="col">State</th>
                <th scope="col">Saved (UTC)</th>
              </tr>
            </thead>
            <tbody>
              {fits.map((f) => (
                <tr key={f.id}>
                  <td>
                    <Link href={`/fits/${f.id}`}>{f.title}</Link> <span className="num text-xs text-ink-muted">v{f.version}</span>
                  </td>
                  <td>{f.rig.name}</td>
                  <td>{f.kind === 'collector' ? collectorModelLabel(f.model) : modelLabel(f.model)}</td>
                  <td>
                    <StateBadge state={f.reviewState} />
                  </td>
                  <td className="num whitespace-nowrap">{f.createdAt.toISOString().slice(0, 16).replace('T', ' ')}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <div className="card p-6 text-ink-soft">
          No saved fits yet. Open a rig and choose <strong>Fit models</strong> (or <strong>Collector efficiency</strong> for a solar collector): <Link href="/rigs">rigs of this lab</Link>.
        </div>
      )}
    </AppPage>
  );
}
