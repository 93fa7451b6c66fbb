import Link from 'next/link';
import { AppPage } from '../../_components/app-page';
import { ComparisonTable, FitStats, FlowChoice, ParameterTable, PerformanceTableView } from '../../_components/fit-report';
import { PlotFigure } from '../../_components/plot-figure';
import { CautionList } from '../../_components/safety-notice';
import { ReviewPanel } from '../../_components/review-panel';
import { modelLabel } from '../../_lib/fits/fit-analysis';
import { reviewTrail } from '../../_lib/review/review';
import { parseStoredFit } from '../../_lib/fits/stored-fit';
import { savedFitPageFigures } from '../../_lib/fits/fits';
import { loadInLab } from '../../_lib/labs/load-in-lab';
import { requireLabAction } from '../../_lib/accounts/viewer';
import { SavedCollectorFit } from './collector-fit';

export const metadata = { title: 'Saved fit' };
export const dynamic = 'force-dynamic';

export default async function SavedFitPage({ params }: { params: Promise<{ fitId: string }> }) {
  const { fitId } = await params;
  const v = await requireLabAction(`/fits/${fitId}`, 'lab:read');
  const { row } = await loadInLab(v, 'fit', fitId, 'lab:read');
  if (row.kind === 'collector') return <SavedCollectorFit viewer={v} row={row} />;
  const rig = row.rig;
  const r = parseStoredFit(row.result, row.id);
  const u = v.user.unitSystem;
  const label = modelLabel(row.model);
  const { curve, heat, residuals } = await savedFitPageFigures(row, u);
  const trail = await reviewTrail(v.em, 'fit', row.id);
  return (
    <AppPage
      viewer={v}
      title={`${row.title} · v${row.version}`}
      lead={
        <>
          {label} on <Link href={`/rigs/${rig.id}`}>{rig.name}</Link>, {row.trialIds.length} trials, saved {row.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC by{' '}
          {row.createdBy?.name ?? 'a former member'}. <span className="num text-xs">{row.softwareVersion} · trials {row.trialsHash.slice(0, 12)}</span>
        </>
      }
      actions={
        <>
          <a className="btn-quiet" href={`/api/fits/${row.id}/export`}>
            Download XLSX
          </a>
          <span className="flex items-center gap-2 text-sm">
            CSV:
            {['Trials', 'Fit', 'Residuals', 'Performance'].map((t) => (
              <a key={t} href={`/api/fits/${row.id}/export?format=csv&table=${t}`}>
                {t}
              </a>
            ))}
          </span>
          <Link className="btn-quiet" href={`/rigs/${rig.id}/fit`}>
            Refit
          </Link>
        </>
      }
    >
      <div className="grid gap-6 xl:grid-cols-[1fr_20rem]">
        <div className="min-w-0 space-y-6">
          <PlotFigure {...curve} filename="outlet-vs-flow" />
          <section className="card space-y-4 p-4">
            <ParameterTable fit={{ ...r.fit, label }} />
            <FitStats fit={{ ...r.fit, label }} units={u} />
          </section>
          <section className="card p-4">
            <h2 className="mb-3 text-lg">Model comparison</h2>
            <ComparisonTable comparison={r.comparison} units={u} />
          </section>
          <div className="grid gap-4 lg:grid-cols-2">
            {residuals.map((f, i) => (
              <PlotFigure key={i} {...f} filename={`residuals-${i}`} />
            ))}
          </div>
          <PlotFigure {...heat} filename="heat-vs-flow" />
          <section className="card p-4">
            <h2 className="mb-3 text-lg">Choosing a flow</h2>
            <FlowChoice choice={r.choice} units={u} />
          </section>
          <section className="card space-y-3 p-4">
            <PerformanceTableView table={r.performance} units={u} />
            <CautionList cautions={r.performance.cautions} />
          </section>
        </div>
        <ReviewPanel
          kind="fit"
          id={row.id}
          state={row.reviewState}
          canSubmit={v.can('fit:write')}
          canDecide={v.can('review:decide')}
          ownWork={row.createdBy?.id === v.user.id}
          canComment={v.can('review:comment')}
          comments={trail.comments}
          events={trail.events}
        />
      </div>
    </AppPage>
  );
}
