import type { EntityManager } from '@mikro-orm/postgresql';
import type { LabRow, StudyRow } from '@/entities';
import type { FitSuccess } from '@/analysis/fit';
import type { FlowChoice as Choice } from '@/analysis/performance/choose-flow';
import { modelLabel } from '../_lib/fit-analysis';
import { forecast } from '../_lib/forecasts';
import { renderMarkdown } from '../_lib/markdown';
import { plotToSvg } from '../_lib/plot-svg';
import { fitCurveInputFromFits, fitCurvePlot } from '../_lib/plots';
import { studyFits } from '../_lib/study-export';
import { Cautions, ComparisonTable, FitStats, FlowChoice, ParameterTable, PerformanceTableView, type ComparisonView, type PerformanceView } from './fit-report';
import { PlotFigure } from './plot-figure';
import { StateBadge } from './review-panel';
import { flowOut, flowUnit, tempOut, tempUnit, type Units } from './units';

const STANDING = [
  'Emberline is an analysis aid, not a design approval: local codes, inspectors and licensed professionals have the final word.',
  'Hot water burns in seconds above 60 °C (140 °F); keep water people touch below 49 °C (120 °F) and spas at or below 40 °C (104 °F).',
  'Never heat a coil that cannot vent; start the flow before lighting and keep it until the coil is cold. Never run a pump against a closed valve.',
  'Fuel-burning equipment makes carbon monoxide: outdoors only, away from openings, with a CO alarm nearby. Electrical equipment near a pool needs GFCI protection.',
];

/** The blocks of a study rendered on the server (first paint, share view, print). */
export async function StudyBlocks({ em, lab, study, units, publicView = false }: { em: EntityManager; lab: LabRow; study: StudyRow; units: Units; publicView?: boolean }) {
  const fits = new Map((await studyFits(em, study)).map((f) => [f.id, f]));
  const out = [];
  for (const b of study.blocks) {
    const fit = typeof b.data.fitId === 'string' ? fits.get(b.data.fitId) : undefined;
    const r = fit?.result as { fit: FitSuccess; comparison: ComparisonView; choice: Choice; performance: PerformanceView; trials: { startedAt: string; flowM3PerS: number; inletC: number; outletC: number }[] } | undefined;
    let body: React.ReactNode;
    switch (b.kind) {
      case 'text':
        body = <div className="study-prose" dangerouslySetInnerHTML={{ __html: renderMarkdown(String(b.data.markdown ?? '')) }} />;
        break;
      case 'caution':
        body = (
          <div className="rounded-lg border border-caution-line bg-caution-bg p-4 text-sm text-caution-text">
            <p className="font-semibold">Safety</p>
            <ul className="mt-1 list-disc space-y-1 pl-5">
              {[...(typeof b.data.text === 'string' && b.data.text ? [b.data.text] : []), ...STANDING].map((t) => (
                <li key={t}>{t}</li>
              ))}
            </ul>
          </div>
        );
        break;
      case 'forecast': {
        try {
          const f = await forecast(em, lab, { ...(b.data as Record<string, unknown>) }, units);
          body = (
            <div className="space-y-3">
              <p className="text-sm">
                Final <span className="num">{tempOut(f.finalTemp_degC, units).toFixed(1)} {tempUnit(units)}</span>
                {f.hoursToTarget_h != null ? <>, target reached after <span className="num">{f.hoursToTarget_h.toFixed(1)} h</span></> : null}.{' '}
                {f.fitNote}
              </p>
              <Cautions cautions={f.cautions} />
              <PlotFigure {...f.plots.trajectory} filename="forecast" />
            </div>
          );
        } catch (e) {
          body = <p className="text-sm text-danger-text">This forecast cannot be computed: {(e as Error).message}</p>;
        }
        break;
      }
      default: {
        if (!fit || !r) {
          body = <p className="text-sm text-ink-muted">No saved fit chosen for this block yet.</p>;
          break;
        }
        const label = modelLabel(fit.model);
        const head = (
          <p className="mb-3 flex flex-wrap items-center gap-2 text-sm text-ink-soft">
            <strong className="text-ink">
              {fit.title} v{fit.version}
            </strong>
            <span>{label}</span>
            <StateBadge state={fit.reviewState} />
            {publicView ? null : <a href={`/fits/${fit.id}`}>open the fit</a>}
          </p>
        );
        if (b.kind === 'fit') {
          const fig = fitCurvePlot(fitCurveInputFromFits([{ label, fit: r.fit }], { inletC: r.choice.inletTempC }), units);
          body = (
            <div className="space-y-4">
              {head}
              <PlotFigure title={fig.title} summary={fig.summary} svg={plotToSvg(fig.options)} filename="fit" />
              <ParameterTable fit={{ ...r.fit, label }} />
              <FitStats fit={{ ...r.fit, label }} units={units} />
              <FlowChoice choice={r.choice} units={units} />
            </div>
          );
        } else if (b.kind === 'comparison') body = <div>{head}<ComparisonTable comparison={r.comparison} units={units} /></div>;
        else if (b.kind === 'performance') body = <div className="space-y-3">{head}<PerformanceTableView table={r.performance} units={units} /><Cautions cautions={r.performance.cautions} /></div>;
        else if (b.kind === 'trials')
          body = (
            <div>
              {head}
              <table className="data-table">
                <thead>
                  <tr>
                    <th scope="col">Started (UTC)</th>
                    <th scope="col" className="text-right">Flow ({flowUnit(units)})</th>
                    <th scope="col" className="text-right">Inlet ({tempUnit(units)})</th>
                    <th scope="col" className="text-right">Outlet ({tempUnit(units)})</th>
                  </tr>
                </thead>
                <tbody>
                  {r.trials.map((t, i) => (
                    <tr key={i}>
                      <td className="num">{t.startedAt.slice(0, 16).replace('T', ' ')}</td>
                      <td className="num text-right">{flowOut(t.flowM3PerS, units).toFixed(2)}</td>
                      <td className="num text-right">{tempOut(t.inletC, units).toFixed(1)}</td>
                      <td className="num text-right">{tempOut(t.outletC, units).toFixed(1)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          );
        else body = <p className="text-sm text-ink-muted">This block kind is not shown yet.</p>;
      }
    }
    out.push(
      <section key={b.id} id={`block-${b.id}`} className="card p-5" aria-label={`${b.kind} block`} data-block={b.kind}>
        {body}
      </section>,
    );
  }
  return <div className="space-y-5">{out}</div>;
}
