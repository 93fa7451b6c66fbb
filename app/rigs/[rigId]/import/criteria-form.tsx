'use client';

import type { PresetName } from '@/analysis/segment/steady-criteria';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { PRESET_TEXT } from './log-thresholds';
import type { LogPeriodsApi } from './use-log-periods';

/** The criteria of a steady period: a preset, its thresholds to edit, and "Find steady periods" with its progress. */
export function CriteriaForm({ log, units }: { log: LogPeriodsApi; units: UnitSystem }) {
  const { preset, edits, progress, preview } = log.state;
  const { rows, base, setPreset, editThreshold, resetThresholds, fail, find } = log;
  return (
    <>
          <div className="flex flex-wrap items-end gap-4">
            <label className="block">
              <span className="field-label">Criteria</span>
              <select aria-label="Criteria preset" className="field-input" value={preset} onChange={(e) => setPreset(e.target.value as PresetName)}>
                {(Object.keys(PRESET_TEXT) as PresetName[]).map((p) => (
                  <option key={p} value={p}>{PRESET_TEXT[p].label}</option>
                ))}
              </select>
            </label>
            <p className="max-w-xl pb-2 text-sm text-ink-muted">{PRESET_TEXT[preset].note}</p>
          </div>
          <details className="rounded-lg border border-paper-line p-3" open={Object.keys(edits).length > 0}>
            <summary className="cursor-pointer text-sm font-semibold">Thresholds{Object.keys(edits).length ? ` (${Object.keys(edits).length} edited)` : ''}</summary>
            <div className="mt-3 grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
              {rows.map((r) => {
                const si = r.key in edits ? edits[r.key] : (base[r.key] as number | null);
                const shown = si === null || si === undefined ? '' : String(Math.round(r.toShow(si) * 10000) / 10000);
                return (
                  <label key={r.key} className="block text-sm">
                    <span className="field-label">
                      {r.label} ({r.unit})
                    </span>
                    <input
                      className="field-input num"
                      inputMode="decimal"
                      aria-label={`${r.label} (${r.unit})`}
                      placeholder={r.nullable ? 'not judged' : ''}
                      defaultValue={shown}
                      key={`${preset}-${r.key}-${units}`}
                      onBlur={(e) => {
                        const t = e.target.value.trim().replace(',', '.');
                        if (t === '') { editThreshold(r.key, r.nullable ? null : base[r.key] as number); return; }
                        const v = Number(t);
                        if (!Number.isFinite(v)) { fail(`${r.label}: "${e.target.value}" is not a number.`); return; }
                        editThreshold(r.key, r.toSI(v));
                      }}
                    />
                  </label>
                );
              })}
            </div>
            {Object.keys(edits).length ? (
              <button type="button" className="btn-quiet mt-3" onClick={resetThresholds}>
                Back to the preset’s thresholds
              </button>
            ) : null}
          </details>
          <div className="flex flex-wrap items-center gap-3">
            <button type="button" className="btn-primary" disabled={progress !== null} onClick={find}>
              {preview ? 'Find the periods again' : 'Find steady periods'}
            </button>
            {progress !== null ? (
              <div className="flex min-w-64 flex-1 items-center gap-3">
                <div role="progressbar" aria-label="Reading the log" aria-valuenow={Math.round(progress * 100)} aria-valuemin={0} aria-valuemax={100} className="h-3 flex-1 overflow-hidden rounded-full bg-paper-deep">
                  <div className="h-full bg-water-600 transition-all" style={{ width: `${Math.round(progress * 100)}%` }} />
                </div>
                <span className="num text-sm text-ink-muted">reading {Math.round(progress * 100)} %</span>
              </div>
            ) : null}
          </div>
    </>
  );
}
