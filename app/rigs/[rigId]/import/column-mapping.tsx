'use client';

import { FIELDS, LOG_FIELDS, UNIT_TEXT, type Field, type Mapping } from './import-types';
import type { ImportWizardApi } from './use-import-wizard';

/**
 * The columns of the uploaded file: what the file holds (trial sheet or sensor log), the sheet,
 * the notes above the header, each column's meaning and unit, the decimal separator and the date
 * order, and "Check again".
 */
export function ColumnMapping({ wizard, duplicate }: { wizard: ImportWizardApi; duplicate: boolean }) {
  const { check, setColumn, setMapping, setSheet } = wizard;
  const { preview, mapping, sheet, busy } = wizard.state;
  if (!preview || !mapping) return null;
  return (
        <section className="card space-y-3 p-4" aria-labelledby="map-h">
          <div className="flex flex-wrap items-baseline justify-between gap-2">
            <h2 id="map-h" className="text-lg">Columns of {preview.file.filename}</h2>
            <span className="num text-xs text-ink-muted">
              {preview.partial ? `${(preview.file.sizeBytes / 1024 / 1024).toFixed(1)} MB, first ${preview.rowCount} rows shown` : `${preview.rowCount} rows`} · sha256 {preview.file.sha256.slice(0, 16)}…
            </span>
          </div>
          {duplicate ? (
            <p className="rounded-lg border border-caution-line bg-caution-bg px-3 py-2 text-sm text-caution-text">
              This exact file was uploaded before{preview.file.state === 'imported' ? ` and imported (${preview.file.rowsImported} trials): importing it again is refused` : ''}.
            </p>
          ) : null}
          <fieldset className="rounded-lg border border-paper-line p-3">
            <legend className="px-1 text-sm font-semibold">This file holds</legend>
            <div className="flex flex-wrap gap-x-6 gap-y-2 text-sm">
              {(
                [
                  ['trialSheet', 'Trial sheet', 'one row per steady trial'],
                  ['sensorLog', 'Sensor log', 'a time series, split into steady periods'],
                ] as const
              ).map(([id, label, note]) => (
                <label key={id} className="flex items-center gap-2">
                  <input
                    type="radio"
                    name="shape"
                    value={id}
                    checked={mapping.shape === id}
                    disabled={(id === 'sensorLog' && preview.kind === 'xlsx') || (id === 'trialSheet' && preview.partial)}
                    onChange={() => {
                      const next = preview.alternatives[id] ?? { ...mapping, shape: id, columns: mapping.columns.filter((c) => id === 'trialSheet' || LOG_FIELDS.has(c.field)) };
                      setMapping(next);
                      void check(preview.file.id, next, sheet);
                    }}
                  />
                  <span>
                    <strong>{label}</strong> <span className="text-ink-muted">— {note}</span>
                  </span>
                </label>
              ))}
            </div>
            <p className="mt-1 text-xs text-ink-muted">
              {preview.shape.shape === mapping.shape ? 'Suggested: ' : 'We would have said otherwise: '}
              {preview.shape.reason}
            </p>
          </fieldset>
          {preview.savedMapping ? <p className="text-sm text-ok-text">These headers came in before: the lab’s saved mapping is applied.</p> : null}
          {preview.sheets.length > 1 ? (
            <label className="block max-w-xs">
              <span className="field-label">Sheet</span>
              <select
                className="field-input"
                value={sheet ?? preview.sheets[0].name}
                onChange={(e) => {
                  setSheet(e.target.value);
                  void check(preview.file.id, undefined, e.target.value);
                }}
              >
                {preview.sheets.map((s) => (
                  <option key={s.name} value={s.name}>
                    {s.name} ({s.rowCount} rows)
                  </option>
                ))}
              </select>
            </label>
          ) : null}
          {preview.metadata.length ? (
            <details className="text-sm text-ink-soft">
              <summary>{preview.metadata.length} line(s) above the header were kept as notes</summary>
              <ul className="num mt-1 text-xs">
                {preview.metadata.map((m) => (
                  <li key={m.line}>
                    {m.line}: {m.text}
                  </li>
                ))}
              </ul>
            </details>
          ) : null}
          <div className="relative overflow-x-auto" tabIndex={0}>
            <table className="data-table">
              <thead>
                <tr>
                  <th scope="col">Column</th>
                  <th scope="col">Means</th>
                  <th scope="col">Unit</th>
                  <th scope="col">Match</th>
                </tr>
              </thead>
              <tbody>
                {preview.header.map((h, i) => {
                  const m = mapping.columns.find((c) => c.column === i);
                  const def = FIELDS.find((f) => f.id === (m?.field ?? ''))!;
                  const sug = preview.suggestion.columns.find((c) => c.column === i);
                  return (
    <tr key={i}>
      <th scope="row" className="num bg-white font-normal">{h}</th>
      <td>
        <select aria-label={`Meaning of column ${h}`} className="rounded border border-paper-line bg-white px-2 py-1" value={m?.field ?? ''} onChange={(e) => setColumn(i, h, e.target.value as Field | '')}>
          {FIELDS.filter((f) => mapping.shape === 'trialSheet' || LOG_FIELDS.has(f.id)).map((f) => (
            <option key={f.id} value={f.id}>
              {f.label}
            </option>
          ))}
        </select>
      </td>
      <td>
        {def.units.length ? (
          <select aria-label={`Unit of column ${h}`} className="rounded border border-paper-line bg-white px-2 py-1" value={m?.unit ?? def.units[0]} onChange={(e) => setColumn(i, h, m!.field, e.target.value)}>
            {def.units.map((u) => (
              <option key={u} value={u}>
                {UNIT_TEXT[u] ?? u}
              </option>
            ))}
          </select>
        ) : (
          <span className="text-ink-muted">—</span>
        )}
      </td>
      <td className="text-xs text-ink-muted">
        {sug ? `${Math.round(sug.confidence * 100)} %` : ''} {sug?.note ?? ''}
      </td>
    </tr>
  );
})}
              </tbody>
            </table>
          </div>
          <div className="flex flex-wrap items-center gap-3">
            <label className="text-sm">
              Decimal separator{' '}
              <select className="rounded border border-paper-line bg-white px-2 py-1" value={mapping.decimal} onChange={(e) => setMapping({ ...mapping, decimal: e.target.value as '.' | ',' })}>
<option value=".">point (12.5)</option>
<option value=",">comma (12,5)</option>
              </select>
            </label>
            {preview.suggestion.dateOrder === 'ambiguous' || mapping.dateOrder ? (
              <label className="text-sm">
Dates are{' '}
<select className="rounded border border-paper-line bg-white px-2 py-1" value={mapping.dateOrder ?? ''} onChange={(e) => setMapping({ ...mapping, dateOrder: (e.target.value || undefined) as Mapping['dateOrder'] })}>
  <option value="">choose…</option>
  <option value="dmy">day/month/year</option>
  <option value="mdy">month/day/year</option>
</select>
              </label>
            ) : null}
            <button type="button" className="btn-quiet" disabled={busy} onClick={() => check(preview.file.id, mapping, sheet)}>
              Check again with this mapping
            </button>
          </div>
          {preview.mappingError ? <p role="alert" className="text-sm text-danger-text">{preview.mappingError}</p> : null}
        </section>
  );
}
