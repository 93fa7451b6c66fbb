'use client';

import type { SegmentPreview } from '@/app/_lib/imports/sensor-preview';
import { num } from './log-model';
import type { LogPeriodsApi } from './use-log-periods';

/** What the log holds: samples and interval, notices, implausible samples, and the rows that cannot be read (to leave out or fix). */
export function LogSummary({ log, preview }: { log: LogPeriodsApi; preview: SegmentPreview }) {
  const { skipBad } = log.state;
  const tooManyBad = preview.rejectedCount > preview.issues.length;
  return (
    <>
          <p className="text-sm">
            <span className="num">{preview.samples.toLocaleString('en')}</span> samples over <span className="num">{num(preview.durationS / 3600, 2)} h</span> (one every{' '}
            <span className="num">{num(preview.medianIntervalS, preview.medianIntervalS < 10 ? 1 : 0)} s</span>):{' '}
            <strong>{preview.segments.length}</strong> steady period{preview.segments.length === 1 ? '' : 's'} found, {preview.rejected.length} run{preview.rejected.length === 1 ? '' : 's'} too short or unsteady
            {preview.gaps.length ? `, ${preview.gaps.length} gap${preview.gaps.length === 1 ? '' : 's'} in the time base` : ''}.
            {preview.series.reduced ? <span className="text-ink-muted"> The plot shows {preview.series.tS.length.toLocaleString('en')} points chosen to keep the shape and every peak.</span> : null}
          </p>
          {preview.notices.map((n) => <p key={n} className="text-sm text-caution-text">{n}</p>)}
          {preview.plausibility.outletBelowInlet || preview.plausibility.aboveBoiling || preview.plausibility.nonPositiveFlow ? (
            <ul className="list-disc pl-5 text-sm text-caution-text">
              {preview.plausibility.outletBelowInlet ? <li>{preview.plausibility.outletBelowInlet.toLocaleString('en')} samples with the outlet below the inlet.</li> : null}
              {preview.plausibility.aboveBoiling ? <li>{preview.plausibility.aboveBoiling.toLocaleString('en')} samples at or above 100 °C: water that hot can flash to steam in an open line and scalds at once. Check the relief path and the sensors.</li> : null}
              {preview.plausibility.nonPositiveFlow ? <li>{preview.plausibility.nonPositiveFlow.toLocaleString('en')} samples with zero or negative flow: never fire a coil without flow (a dead-headed or stopped pump lets it boil).</li> : null}
            </ul>
          ) : null}
          {preview.rejectedCount ? (
            <div className="space-y-2 rounded-lg border border-danger-line bg-danger-bg p-3 text-sm text-danger-text">
              <p className="font-semibold">
                {preview.rejectedCount.toLocaleString('en')} row{preview.rejectedCount === 1 ? '' : 's'} cannot be read{tooManyBad ? ` (the first ${preview.issues.length} are listed)` : ''}.
              </p>
              <table className="data-table bg-white" aria-label="Log rows with errors">
                <thead><tr><th scope="col">Line</th><th scope="col">Column</th><th scope="col">Problem</th></tr></thead>
                <tbody>
                  {preview.issues.slice(0, 50).map((i) => (
                    <tr key={i.line}><td className="num">{i.line}</td><td>{i.column ?? ''}</td><td>{i.message}</td></tr>
                  ))}
                </tbody>
              </table>
              <label className="flex items-center gap-2">
                <input type="checkbox" checked={skipBad} onChange={(e) => log.setSkipBad(e.target.checked)} />
                {preview.rejectedCount === 1 ? 'Leave this row out of the import' : `Leave these ${preview.rejectedCount.toLocaleString('en')} rows out of the import`}
              </label>
              <p className="text-xs">The file is kept as it is; the rows left out are counted with the import. A column mapped wrongly also makes rows fail: check the mapping first.</p>
            </div>
          ) : null}
    </>
  );
}
