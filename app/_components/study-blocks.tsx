'use client';

import type { ReactNode } from 'react';
import { ApiError } from './api';
import { ComparisonTable, FitStats, FlowChoice, ParameterTable, PerformanceTableView } from './fit-report';
import { PlotFigure } from './plot-figure';
import { DesignComparison } from './design-comparison';
import { CautionList, TempValue, TemperatureCautions } from './safety-notice';
import { StateBadge } from './review-panel';
import { CollectorReport } from './collector-report';
import { MeasuredDay } from './measured-day';
import { OperatingPlanView } from './operating-plan-view';
import { SensorLogView } from './sensor-log-view';
import { SeasonResult } from './season-result';
import { TubFillResultView } from './tub-fill-result';
import type { BlockBody, BlockData, CostView, FitHead } from '../_contracts/study-blocks';
import { sharedBlockKey, studyBlockKey } from '../_contracts/study-keys';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { useStudy } from './use-study';
import { useStudyBlock } from './use-study-block';

/** Where the blocks come from: the lab's own study page, or a share link (with the reader's units). */
export type BlocksSource = { studyId: string } | { token: string; units: UnitSystem; blocks: { id: string; kind: string }[] };

/**
 * The blocks of a study. Each block's data comes from its block-data route through SWR; the page
 * rendered on the server passes every block in the SWR fallback, so the first paint is complete
 * and no block is fetched until the editor changes it.
 */
export function StudyBlocks({ source }: { source: BlocksSource }) {
  const study = useStudy('studyId' in source ? source.studyId : null);
  const list = 'studyId' in source ? (study.data?.study.blocks ?? []) : source.blocks;
  const keyOf = (id: string) => ('studyId' in source ? studyBlockKey(source.studyId, id) : sharedBlockKey(source.token, id, source.units));
  if (!list.length) return <p className="card p-5 text-sm text-ink-muted">This study has no blocks yet.</p>;
  return (
    <div className="space-y-5">
      {list.map((b) => (
        <Block key={b.id} swrKey={keyOf(b.id)} id={b.id} kind={b.kind} />
      ))}
    </div>
  );
}

function Block({ swrKey, id, kind }: { swrKey: string; id: string; kind: string }) {
  const { data, error, isValidating, mutate } = useStudyBlock(swrKey);
  let content: ReactNode;
  if (data) content = <BlockView block={data.block} />;
  else if (error) {
    content = (
      <p role="alert" className="text-sm text-danger-text">
        This block could not be loaded: {error instanceof ApiError ? error.message : 'the server could not be reached.'}{' '}
        <button type="button" className="btn-quiet px-2 py-1" onClick={() => void mutate()}>
          Try again
        </button>
      </p>
    );
  } else content = <p className="text-sm text-ink-muted">Loading this block…</p>;
  return (
    <section id={`block-${id}`} className="card p-5" aria-label={`${kind} block`} aria-busy={isValidating || undefined} data-block={kind}>
      {content}
    </section>
  );
}

function Head({ head }: { head: FitHead }) {
  return (
    <p className="mb-3 flex flex-wrap items-center gap-2 text-sm text-ink-soft">
      <strong className="text-ink">
        {head.title} v{head.version}
      </strong>
      <span>{head.label}</span>
      <StateBadge state={head.reviewState} />
      {head.fitId ? <a href={`/fits/${head.fitId}`}>open the fit</a> : null}
    </p>
  );
}

/** One block's body from its data. */
export function BlockView({ block }: { block: BlockData }) {
  const b: BlockBody = block.body;
  const units = block.units;
  switch (b.type) {
    case 'text':
      return <div className="study-prose" dangerouslySetInnerHTML={{ __html: b.html }} />;
    case 'caution':
      return (
        <div className="rounded-lg border border-caution-line bg-caution-bg p-4 text-sm text-caution-text">
          <p className="font-semibold">Safety</p>
          <ul className="mt-1 list-disc space-y-1 pl-5">
            {b.items.map((t) => (
              <li key={t}>{t}</li>
            ))}
          </ul>
        </div>
      );
    case 'note':
      return <p className={`text-sm ${b.tone === 'danger' ? 'text-danger-text' : 'text-ink-muted'}`}>{b.message}</p>;
    case 'forecast':
      return (
        <div className="space-y-3">
          <p className="text-sm">
            Final <span className="num"><TempValue tempC={b.finalTempC} units={units} withUnit /></span>
            {b.hoursToTarget != null ? <>, target reached after <span className="num">{b.hoursToTarget.toFixed(1)} h</span></> : null}. {b.fitNote}
          </p>
          {b.equilibriumTempC != null || b.holdNote ? (
            <p className="text-sm text-ink-soft">
              {b.equilibriumTempC != null ? <>Settles near <span className="num"><TempValue tempC={b.equilibriumTempC} units={units} withUnit /></span> (heater gains equal losses). </> : null}
              {b.holdNote ?? ''}
            </p>
          ) : null}
          <CautionList cautions={b.cautions} />
          {b.measuredDay ? <MeasuredDay day={b.measuredDay} units={units} /> : null}
          <PlotFigure {...b.plot} filename="forecast" />
        </div>
      );
    case 'collector':
      return (
        <div className="space-y-4">
          <Head head={b.head} />
          <CollectorReport view={b.view} filename="collector" />
        </div>
      );
    case 'fit':
      return (
        <div className="space-y-4">
          <Head head={b.head} />
          <PlotFigure {...b.plot} filename="fit" />
          <ParameterTable fit={b.fit} />
          <FitStats fit={b.fit} units={units} />
          <FlowChoice choice={b.choice} units={units} />
        </div>
      );
    case 'comparison':
      return (
        <div>
          <Head head={b.head} />
          <ComparisonTable comparison={b.comparison} units={units} />
        </div>
      );
    case 'performance':
      return (
        <div className="space-y-3">
          <Head head={b.head} />
          <PerformanceTableView table={b.table} units={units} />
          <CautionList cautions={b.table.cautions} />
        </div>
      );
    case 'trials':
      return (
        <div>
          <Head head={b.head} />
          <table className="data-table">
            <thead>
              <tr>
                <th scope="col">Started (UTC)</th>
                <th scope="col" className="text-right">Flow ({displayUnits(units).flow.label})</th>
                <th scope="col" className="text-right">Inlet ({displayUnits(units).temp.label})</th>
                <th scope="col" className="text-right">Outlet ({displayUnits(units).temp.label})</th>
              </tr>
            </thead>
            <tbody>
              {b.trials.map((t, i) => (
                <tr key={i}>
                  <td className="num">{t.startedAt.slice(0, 16).replace('T', ' ')}</td>
                  <td className="num text-right">{displayUnits(units).flow.from(t.flowM3PerS).toFixed(2)}</td>
                  <td className="num text-right"><TempValue tempC={t.inletTempC} units={units} /></td>
                  <td className="num text-right"><TempValue tempC={t.outletTempC} units={units} /></td>
                </tr>
              ))}
            </tbody>
          </table>
          <div className="mt-3">
            <TemperatureCautions units={units} label="Cautions for these trials" places={[{ where: 'outlet', valuesC: b.trials.map((t) => t.outletTempC) }, { where: 'inlet', valuesC: b.trials.map((t) => t.inletTempC) }]} />
          </div>
        </div>
      );
    case 'costs':
      return <CostSheet cost={b.cost} units={units} />;
    case 'tub-fill':
      return (
        <div className="space-y-3">
          <Head head={b.head} />
          <TubFillResultView fill={b.fill} units={units} inputs />
        </div>
      );
    case 'design-comparison':
      return (
        <div className="space-y-3">
          <p className="text-sm text-ink-soft">
            <strong className="text-ink">{b.view.title}</strong> {b.comparisonId ? <a href={`/comparisons/${b.comparisonId}`}>open the comparison</a> : null}
          </p>
          <DesignComparison view={b.view} units={units} links={!!b.comparisonId} filename={`comparison-${block.id}`} />
        </div>
      );
    case 'operating-plan':
      return (
        <div className="space-y-3">
          <p className="flex flex-wrap items-center gap-2 text-sm text-ink-soft">
            <strong className="text-ink">Operating plan: {b.name}</strong>
            <span>{b.rigName}</span>
            {b.rigId ? <a href={`/rigs/${b.rigId}`}>open the rig</a> : null}
          </p>
          <OperatingPlanView plan={b.plan} units={units} />
        </div>
      );
    case 'sensor-log':
      return <SensorLogView log={b} units={units} />;
  }
}

/** Money to the cent, or to a tenth of a cent below one unit (a useful kWh costs cents). */
const money = (v: number, c: string) => `${v.toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: Math.abs(v) < 1 ? 3 : 2 })} ${c}`;

/** The cost-sheet block: running cost per useful heat, per degree and of the heat-up, with its cautions. */
function CostSheet({ cost: c, units }: { cost: CostView; units: UnitSystem }) {
  const us = units === 'us';
  const u = displayUnits(units);
  const rows: [string, string][] = [
    [`${c.fuelLabel} price`, `${money(c.price, c.currency)} per ${c.priceUnit}`],
    [c.efficiencyIsCop ? 'COP' : 'Efficiency (HHV)', c.efficiencyIsCop ? c.efficiency.toFixed(2) : `${(c.efficiency * 100).toFixed(0)} %`],
    ['Per useful therm (100,000 Btu delivered)', money(c.perUsefulTherm, c.currency)],
    ['Per useful kWh', money(c.perUsefulKWh, c.currency)],
  ];
  if (c.perDegF !== null && c.perK !== null) rows.push([`Per degree of the pool (${u.tempDiff.label})`, money(us ? c.perDegF : c.perK, c.currency)]);
  if (c.volumeM3 !== null && c.riseK !== null) {
    rows.push(['Heat-up', `${u.tempDiff.from(c.riseK).toFixed(1)} ${u.tempDiff.label} rise of ${u.volume.from(c.volumeM3).toLocaleString('en-US', { maximumFractionDigits: 0 })} ${u.volume.label}`]);
  }
  rows.push(
    ['Useful heat', `${u.energy.from(c.heatJ).toLocaleString('en-US', { maximumFractionDigits: 1 })} ${u.energy.label}`],
    [`${c.fuelLabel} for that heat`, `${c.fuelQuantity.toLocaleString('en-US', { maximumFractionDigits: 1 })} ${c.priceUnit}`],
    ['Cost of that heat', money(c.heatCost, c.currency)],
  );
  return (
    <div className="space-y-3">
      <p className="text-sm text-ink-soft">
        <strong className="text-ink">Running cost: {c.fuelLabel.toLowerCase()}</strong> — heat from {c.heatBasis}.
      </p>
      <table className="data-table" data-testid="cost-sheet">
        <tbody>
          {rows.map(([k, v]) => (
            <tr key={k}>
              <th scope="row" className="text-left font-normal">
                {k}
              </th>
              <td className="num text-right">{v}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="rounded-lg border border-caution-line bg-caution-bg p-3 text-sm text-caution-text">
        <ul className="list-disc space-y-1 pl-5">
          {c.cautions.map((t) => (
            <li key={t}>{t}</li>
          ))}
        </ul>
      </div>
      {c.season ? <SeasonResult season={c.season} units={units} /> : null}
      <p className="text-xs text-ink-muted">Heat content and default efficiency: {c.source}</p>
    </div>
  );
}
