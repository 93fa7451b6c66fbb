'use client';

import type { SegmentPreview } from '@/app/_lib/imports/sensor-preview';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnits } from '@/app/_contracts/units';
import { TempValue, TemperatureCautions } from '../../../_components/safety-notice';
import { clock, minutes, num, PAGE } from './log-model';
import type { LogPeriodsApi } from './use-log-periods';

/** The periods to import as trials: keep, zoom to, move the start or end of each, with their means, cautions and paging. */
export function PeriodsTable({ log, preview, units }: { log: LogPeriodsApi; preview: SegmentPreview; units: UnitSystem }) {
  const { choices, page, measuring } = log.state;
  return (
    <>
          <div className="relative overflow-x-auto" tabIndex={0}>
            <table className="data-table" aria-label="Steady periods">
              <caption className="py-1 text-left text-sm font-semibold">Periods to import as trials{measuring ? ' — measuring…' : ''}</caption>
              <thead>
                <tr>
                  <th scope="col">Keep</th>
                  <th scope="col">#</th>
                  <th scope="col">Start (min)</th>
                  <th scope="col">End (min)</th>
                  <th scope="col" className="text-right">Length (min)</th>
                  <th scope="col" className="text-right">Flow ({displayUnits(units).flow.label})</th>
                  <th scope="col" className="text-right">Inlet ({displayUnits(units).temp.label})</th>
                  <th scope="col" className="text-right">Outlet ({displayUnits(units).temp.label})</th>
                  <th scope="col" className="text-right">u(outlet) ({displayUnits(units).tempDiff.label})</th>
                  <th scope="col">Lines</th>
                  <th scope="col">Notes</th>
                </tr>
              </thead>
              <tbody>
                {choices.slice(page * PAGE, (page + 1) * PAGE).map((c) => {
                  const m = c.measured;
                  return (
                    <tr key={c.id} className={c.use ? '' : 'text-ink-muted line-through decoration-ink-muted/50'}>
                      <td>
                        <input type="checkbox" aria-label={`Keep period ${c.label}`} checked={c.use} onChange={(e) => log.setChoice(c.id, { use: e.target.checked })} />
                      </td>
                      <td className="num">
                        <button
                          type="button"
                          className="underline decoration-dotted"
                          title="Plot this period and its surroundings"
                          aria-label={`Zoom to period ${c.label}`}
                          onClick={() => {
                            const pad = Math.max(300, (c.endS - c.startS) * 0.5);
                            void log.zoom({ startS: Math.max(0, c.startS - pad), endS: Math.min(preview.durationS, c.endS + pad) });
                          }}
                        >
                          {c.label}
                        </button>
                      </td>
                      {(['startS', 'endS'] as const).map((k) => (
                        <td key={k}>
                          <input
                            className="num w-24 rounded border border-paper-line bg-white px-2 py-1"
                            aria-label={`${k === 'startS' ? 'Start' : 'End'} of period ${c.label} (min)`}
                            inputMode="decimal"
                            disabled={!c.use}
                            key={`${c.id}-${k}-${c[k]}`}
                            defaultValue={minutes(c[k])}
                            onBlur={(e) => {
                              const v = Number(e.target.value.trim().replace(',', '.'));
                              if (!Number.isFinite(v) || v < 0) { log.fail(`Period ${c.label}: "${e.target.value}" is not a time in minutes.`); return; }
                              if (Math.abs(v - minutes(c[k])) > 1e-9) log.setChoice(c.id, { [k]: v * 60 });
                            }}
                          />
                          <span className="num ml-1 text-xs text-ink-muted">{clock(preview.startIso, c[k], preview.durationS > 86_400)}</span>
                        </td>
                      ))}
                      <td className="num text-right">{num((c.endS - c.startS) / 60, 1)}</td>
                      <td className="num text-right">{m ? num(displayUnits(units).flow.from(m.mean.flowM3PerS), 2) : '…'}</td>
                      <td className="num text-right">{m ? <TempValue tempC={m.mean.inletTempC} units={units} digits={2} /> : '…'}</td>
                      <td className="num text-right">{m ? <TempValue tempC={m.mean.outletTempC} units={units} digits={2} /> : '…'}</td>
                      <td className="num text-right">{m?.blockStdError ? num(displayUnits(units).tempDiff.from(m.blockStdError.outletTempC), 3) : m ? '—' : '…'}</td>
                      <td className="num text-xs">{m ? `${m.startLine}–${m.endLine}` : ''}</td>
                      <td className="text-xs text-caution-text">{m?.notes.join('; ')}</td>
                    </tr>
                  );
                })}
                {!choices.length ? (
                  <tr><td colSpan={11} className="text-sm text-ink-muted">No steady period with these criteria: loosen a threshold, or take a run below anyway.</td></tr>
                ) : null}
              </tbody>
            </table>
          </div>
          <TemperatureCautions units={units}
            label="Cautions for these periods"
            places={[
              { where: 'outlet', valuesC: choices.filter((c) => c.use).map((c) => c.measured?.mean.outletTempC) },
              { where: 'inlet', valuesC: choices.filter((c) => c.use).map((c) => c.measured?.mean.inletTempC) },
            ]}
          />
          <div className="flex flex-wrap items-center gap-3 text-sm">
            {choices.length > PAGE ? (
              <>
                <button type="button" className="btn-quiet" disabled={page === 0} onClick={() => log.setPage(page - 1)}>
                  Previous
                </button>
                <span className="num">
                  {page * PAGE + 1}–{Math.min(choices.length, (page + 1) * PAGE)} of {choices.length}
                </span>
                <button type="button" className="btn-quiet" disabled={(page + 1) * PAGE >= choices.length} onClick={() => log.setPage(page + 1)}>
                  Next
                </button>
              </>
            ) : null}
            {choices.length > 1 ? (
              <>
                <button type="button" className="btn-quiet" onClick={() => log.useAll(true)}>
                  Keep all
                </button>
                <button type="button" className="btn-quiet" onClick={() => log.useAll(false)}>
                  Drop all
                </button>
              </>
            ) : null}
          </div>
    </>
  );
}
