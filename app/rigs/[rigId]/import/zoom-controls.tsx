'use client';

import type { SegmentPreview } from '@/app/_lib/imports/sensor-preview';
import { num } from './log-model';
import type { LogPeriodsApi } from './use-log-periods';

/** The plotted stretch of the log: hours from its start, or the whole log. */
export function ZoomControls({ log, preview }: { log: LogPeriodsApi; preview: SegmentPreview }) {
  const { view } = log.state;
  return (
    <>
          <div className="flex flex-wrap items-end gap-3 text-sm" role="group" aria-label="Plotted stretch">
            <span className="pb-2 text-ink-soft">{view ? `Showing ${num(view.startS / 3600, 2)}–${num(view.endS / 3600, 2)} h of ${num(preview.durationS / 3600, 2)} h` : 'Showing the whole log'}</span>
            <form
              className="flex items-end gap-2"
              onSubmit={(e) => {
                e.preventDefault();
                const f = new FormData(e.currentTarget);
                const a = Number(String(f.get('from')).replace(',', '.')) * 3600, b = Number(String(f.get('to')).replace(',', '.')) * 3600;
                if (!(Number.isFinite(a) && Number.isFinite(b) && b > a)) { log.fail('Zoom: give a start and a later end, in hours from the start of the log.'); return; }
                void log.zoom({ startS: a, endS: b });
              }}
            >
              <label>
                <span className="field-label">From (h)</span>
                <input name="from" inputMode="decimal" className="num w-20 rounded border border-paper-line bg-white px-2 py-1" defaultValue={num((view?.startS ?? 0) / 3600, 2)} key={`f${view?.startS}`} />
              </label>
              <label>
                <span className="field-label">To (h)</span>
                <input name="to" inputMode="decimal" className="num w-20 rounded border border-paper-line bg-white px-2 py-1" defaultValue={num((view?.endS ?? preview.durationS) / 3600, 2)} key={`t${view?.endS}`} />
              </label>
              <button type="submit" className="btn-quiet">Zoom</button>
            </form>
            {view ? (
              <button type="button" className="btn-quiet" onClick={() => void log.zoom(null)}>
                Whole log
              </button>
            ) : null}
          </div>
    </>
  );
}
