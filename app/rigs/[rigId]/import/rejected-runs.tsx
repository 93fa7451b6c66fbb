'use client';

import type { SegmentPreview } from '@/app/_lib/imports/sensor-preview';
import { num } from './log-model';
import type { LogPeriodsApi } from './use-log-periods';

/** The runs that did not pass the criteria, with the reason, each to use anyway. */
export function RejectedRuns({ log, preview }: { log: LogPeriodsApi; preview: SegmentPreview }) {
  const { choices } = log.state;
  return (
    <>
          {preview.rejected.length ? (
            <details className="text-sm">
              <summary className="cursor-pointer">Runs that did not pass ({preview.rejected.length}), with the reason</summary>
              <ul className="mt-2 space-y-1">
                {preview.rejected.slice(0, 100).map((r) => {
                  const id = `r${r.startLine}`;
                  const taken = choices.some((c) => c.id === id);
                  return (
                    <li key={id} className="flex flex-wrap items-baseline gap-x-3">
                      <span className="num">{num(r.startS / 60, 1)}–{num(r.endS / 60, 1)} min</span>
                      <span className="text-ink-soft">{r.reason}</span>
                      {taken ? <span className="text-ink-muted">taken</span> : (
                        <button type="button" className="underline" onClick={() => log.take(r)}>
                          Use anyway
                        </button>
                      )}
                    </li>
                  );
                })}
              </ul>
            </details>
          ) : null}
    </>
  );
}
