import { ComparisonTable, FitStats, FlowChoice, ParameterTable, PerformanceTableView } from '../../_components/fit-report';
import { PlotFigure } from '../../_components/plot-figure';
import { CautionList } from '../../_components/safety-notice';
import { modelLabel } from '../../_lib/fits/fit-analysis';
import { parseStoredFit } from '../../_lib/fits/stored-fit';
import { savedFitPageFigures } from '../../_lib/fits/fits';
import { loadInLab } from '../../_lib/labs/load-in-lab';
import { requireLabAction } from '../../_lib/accounts/viewer';
import { SavedCollectorFit } from './collector-fit';
import { SavedFitFrame } from './saved-fit-frame';

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
  return (
    <SavedFitFrame viewer={v} row={row} modelLabel={label} csvTables={['Trials', 'Fit', 'Residuals', 'Performance']} refitHref={`/rigs/${rig.id}/fit`}>
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
    </SavedFitFrame>
  );
}
