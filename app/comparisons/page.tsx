import Link from 'next/link';
import { AppPage } from '../_components/app-page';
import { requireLabAction } from '../_lib/accounts/viewer';
import { comparisonsOfLab, MAX_COMPARED } from '../_lib/comparisons/comparisons';
import { fitsOfLab } from '../_lib/fits/fits';
import { modelLabel } from '../_lib/fits/fit-analysis';
import { rigsOfLab } from '../_lib/rigs/rigs';
import { NewComparison } from './new-comparison';

export const metadata = { title: 'Compare designs' };
export const dynamic = 'force-dynamic';

export default async function ComparisonsPage() {
  const v = await requireLabAction('/comparisons', 'lab:read');
  const comparisons = await comparisonsOfLab(v.em, v.current.lab);
  const writer = v.can('study:write');
  const { rigs, counts } = writer ? await rigsOfLab(v.em, v.current.lab) : { rigs: [], counts: new Map<string, number>() };
  const fits = writer ? await fitsOfLab(v.em, v.current.lab, { limit: 100 }) : [];
  return (
    <AppPage viewer={v} title="Compare designs" lead="Did the longer coil, the wider tube or the new burner make a difference the data can show? Put two or more rigs or saved fits side by side.">
      <div className="grid gap-6 lg:grid-cols-[1fr_24rem]">
        <div className="card h-fit overflow-x-auto">
          <table className="data-table">
            <thead>
              <tr>
                <th scope="col">Comparison</th>
                <th scope="col" className="text-right">Designs</th>
                <th scope="col">By</th>
                <th scope="col">Saved (UTC)</th>
              </tr>
            </thead>
            <tbody>
              {comparisons.map((c) => (
                <tr key={c.id}>
                  <td>
                    <Link href={`/comparisons/${c.id}`}>{c.title}</Link>
                  </td>
                  <td className="num text-right">{c.subjects.length}</td>
                  <td>{c.createdBy?.name ?? 'a former member'}</td>
                  <td className="num whitespace-nowrap">{c.createdAt.toISOString().slice(0, 16).replace('T', ' ')}</td>
                </tr>
              ))}
              {comparisons.length === 0 ? (
                <tr>
                  <td colSpan={4} className="text-ink-muted">No comparisons yet.</td>
                </tr>
              ) : null}
            </tbody>
          </table>
        </div>
        {writer ? (
          <section className="card p-4">
            <h2 className="text-lg">New comparison</h2>
            <NewComparison
              labId={v.current.lab.id}
              units={v.user.unitSystem}
              max={MAX_COMPARED}
              rigs={rigs.map((r) => ({ id: r.id, name: r.name, trials: counts.get(r.id) ?? 0 }))}
              fits={fits.map((f) => ({ id: f.id, title: `${f.title} v${f.version}`, rig: f.rig.name, model: modelLabel(f.model) }))}
            />
          </section>
        ) : null}
      </div>
    </AppPage>
  );
}
