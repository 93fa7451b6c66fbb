'use client';

import type { UnitSystem } from '@/analysis/units/unit-system';
import { JobProgress } from '../../../_components/job-progress';
import { PlotFigure } from '../../../_components/plot-figure';
import { CriteriaForm } from './criteria-form';
import { LogSummary } from './log-summary';
import type { Mapping } from './log-model';
import { PeriodsTable } from './periods-table';
import { RejectedRuns } from './rejected-runs';
import { useLogPeriods } from './use-log-periods';
import { ZoomControls } from './zoom-controls';

/**
 * The sensor-log half of the import page: thresholds, the steady periods on a time-series plot,
 * accept / adjust / drop each (or take a rejected run anyway), then the background import with its
 * progress. Nothing is stored until "Import".
 */
export function LogPeriods({ rigId, fileId, fileState, mapping, units }: { rigId: string; fileId: string; fileState: string; mapping: Mapping; units: UnitSystem }) {
  const log = useLogPeriods({ rigId, fileId, mapping, units });
  const { preview, choices, error, skipBad, busy, measuring, jobId } = log.state;
  const { figures, stale, startImport } = log;

  if (jobId) {
    return (
      <section className="card space-y-3 p-4" aria-labelledby="job-h">
        <h2 id="job-h" className="text-lg">Import</h2>
        <JobProgress jobId={jobId} rigId={rigId} />
      </section>
    );
  }

  const used = choices.filter((c) => c.use);
  // rows that cannot be read are never part of the periods; the import leaves them out only when told to
  const blockingRows = preview ? preview.rejectedCount > 0 && !skipBad : false;

  return (
    <section className="card space-y-4 p-4" aria-labelledby="periods-h">
      <h2 id="periods-h" className="text-lg">Steady periods</h2>
      <p className="text-sm text-ink-soft">
        Each steady period of the log becomes one trial (its means, with standard errors from 30-s blocks); every sample is kept with it. Choose the criteria, look at the periods on the plot, then keep, adjust or drop each one.
      </p>
      <CriteriaForm log={log} units={units} />
      {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">{error}</p> : null}
      {preview && figures ? (
        <div className="space-y-4">
          <LogSummary log={log} preview={preview} />
          <ZoomControls log={log} preview={preview} />
          <PlotFigure svg="" options={figures.temperatures.options} title={figures.temperatures.title} summary={figures.temperatures.summary} cautions={figures.temperatures.cautions} filename="log-temperatures" />
          <PlotFigure svg="" options={figures.flow.options} title={figures.flow.title} summary={figures.flow.summary} filename="log-flow" />
          {figures.irradiance ? <PlotFigure svg="" options={figures.irradiance.options} title={figures.irradiance.title} summary={figures.irradiance.summary} filename="log-irradiance" /> : null}
          <PeriodsTable log={log} preview={preview} units={units} />
          <RejectedRuns log={log} preview={preview} />
          {used.some((c) => c.from === 'rejected' || c.measured?.notes.length) ? (
            <p className="text-sm text-caution-text">Periods marked * or with notes do not meet the criteria; they are imported as you chose and the criteria are stored with each trial, so a reviewer sees it.</p>
          ) : null}
          <div className="flex flex-wrap items-center gap-3 border-t border-paper-line pt-4">
            <button type="button" className="btn-primary" disabled={busy || measuring || stale || blockingRows || fileState === 'imported'} onClick={startImport}>
              Import {preview.samples.toLocaleString('en')} samples and {used.length} trial{used.length === 1 ? '' : 's'}
            </button>
            {blockingRows ? <span className="text-sm text-danger-text">Rows with errors must be fixed or left out first.</span> : null}
            {fileState === 'imported' ? <span className="text-sm text-ink-muted">This file has already been imported.</span> : null}
            {!used.length ? <span className="text-sm text-caution-text">No period kept: only the samples will be stored.</span> : null}
          </div>
        </div>
      ) : null}
    </section>
  );
}
