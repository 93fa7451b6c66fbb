'use client';

import Link from 'next/link';
import { useState } from 'react';
import { api, ApiError } from '../../../_components/api';
import { TempValue, TemperatureCautions } from '../../../_components/safety-notice';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { LogPeriods } from './log-periods';

type Field = 'time' | 'bucketVolume' | 'fillTime' | 'flow' | 'inletTemp' | 'outletTemp' | 'ambientTemp' | 'notes';
interface MappingColumn {
  column: number;
  header: string;
  field: Field;
  unit?: string;
}
type Shape = 'trialSheet' | 'sensorLog';
interface Mapping {
  shape: Shape;
  decimal: '.' | ',';
  dateOrder?: 'dmy' | 'mdy';
  columns: MappingColumn[];
}
interface Issue {
  line: number;
  severity: 'error' | 'warning';
  column?: string;
  message: string;
}
interface Preview {
  file: { id: string; filename: string; sizeBytes: number; sha256: string; state: string; rowsImported: number };
  kind: 'xlsx' | 'text';
  sheets: { name: string; rowCount: number }[];
  header: string[];
  metadata: { line: number; text: string }[];
  warnings: string[];
  rowCount: number;
  /** only the head of a large file was read */
  partial: boolean;
  shape: { shape: Shape; reason: string; medianIntervalS: number | null };
  alternatives: { trialSheet: Mapping; sensorLog: Mapping | null };
  logHead: { accepted: number; rejected: number; issues: Issue[]; notices: string[]; rows: { line: number; timeS: number; inletTempC: number; outletTempC: number; flowM3PerS: number }[] } | null;
  suggestion: { columns: { column: number; confidence: number; note?: string }[]; missing: string[]; dateOrder: string | null };
  savedMapping: boolean;
  mapping: Mapping;
  mappingError: string | null;
  check: { okCount: number; errorCount: number; warningCount: number; notices: string[]; issues: Issue[]; preview: { line: number; ok: boolean; row?: { flowM3PerS: number; inletTempC: number; outletTempC: number } }[]; hottest?: { inletTempC: number | null; outletTempC: number | null; outletLine: number | null } } | null;
}

const FIELDS: { id: Field | ''; label: string; units: string[] }[] = [
  { id: '', label: '— ignore —', units: [] },
  { id: 'time', label: 'Time', units: ['datetime', 's', 'min', 'h'] },
  { id: 'bucketVolume', label: 'Bucket volume', units: ['L', 'mL', 'gal', 'm^3', 'ft^3'] },
  { id: 'fillTime', label: 'Fill time', units: ['s', 'min', 'ms'] },
  { id: 'flow', label: 'Flow reading', units: ['L/min', 'L/s', 'L/h', 'gpm', 'gph', 'm^3/h', 'm^3/s', 'mL/s', 'mL/min'] },
  { id: 'inletTemp', label: 'Inlet temperature', units: ['degC', 'degF', 'K'] },
  { id: 'outletTemp', label: 'Outlet temperature', units: ['degC', 'degF', 'K'] },
  { id: 'ambientTemp', label: 'Ambient temperature', units: ['degC', 'degF', 'K'] },
  { id: 'notes', label: 'Notes', units: [] },
];
/** Fields a sensor log maps (time, the two temperatures, flow, optional ambient). */
const LOG_FIELDS = new Set<Field | ''>(['', 'time', 'flow', 'inletTemp', 'outletTemp', 'ambientTemp']);
const UNIT_TEXT: Record<string, string> = { degC: '°C', degF: '°F', 'm^3': 'm³', 'ft^3': 'ft³', 'm^3/h': 'm³/h', 'm^3/s': 'm³/s', gal: 'US gal', datetime: 'date/time' };

function uploadWithProgress(url: string, file: File, onProgress: (f: number) => void): Promise<{ file: { id: string }; duplicate: boolean }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.setRequestHeader('Content-Type', file.type || 'application/octet-stream');
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => {
      let body: Record<string, unknown> = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        /* not JSON */
      }
      if (xhr.status >= 200 && xhr.status < 300) resolve(body as { file: { id: string }; duplicate: boolean });
      else reject(new ApiError(xhr.status, String(body.message ?? `Upload failed (${xhr.status}).`)));
    };
    xhr.onerror = () => reject(new ApiError(0, 'The upload was interrupted: check the connection and try again.'));
    xhr.send(file);
  });
}

/** The first rows of a file converted to the user's units (with the log's time from its start when given). */
function ConvertedRows({ rows, units, tempDigits, caption }: { rows: { line: number; timeS?: number; flowM3PerS: number; inletTempC: number; outletTempC: number }[]; units: UnitSystem; tempDigits: number; caption?: string }) {
  const timed = rows.some((r) => r.timeS !== undefined);
  return (
    <table className="data-table">
      {caption ? <caption className="py-1 text-left text-sm font-semibold">{caption}</caption> : null}
      <thead>
        <tr>
          <th scope="col">Line</th>
          {timed ? <th scope="col" className="text-right">Time (s)</th> : null}
          <th scope="col" className="text-right">Flow ({displayUnits(units).flow.label})</th>
          <th scope="col" className="text-right">Inlet ({displayUnits(units).temp.label})</th>
          <th scope="col" className="text-right">Outlet ({displayUnits(units).temp.label})</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.line}>
            <td className="num">{r.line}</td>
            {timed ? <td className="num text-right">{r.timeS?.toFixed(1)}</td> : null}
            <td className="num text-right">{displayUnits(units).flow.from(r.flowM3PerS).toFixed(2)}</td>
            <td className="num text-right"><TempValue tempC={r.inletTempC} units={units} digits={tempDigits} /></td>
            <td className="num text-right"><TempValue tempC={r.outletTempC} units={units} digits={tempDigits} /></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** Upload → map and check → confirm. Nothing is written as trials until the engineer confirms. */
export function ImportWizard({ rigId, units, maxMb }: { rigId: string; units: UnitSystem; maxMb: number }) {
  const [progress, setProgress] = useState<number | null>(null);
  const [duplicate, setDuplicate] = useState(false);
  const [preview, setPreview] = useState<Preview | null>(null);
  const [mapping, setMapping] = useState<Mapping | null>(null);
  const [sheet, setSheet] = useState<string | undefined>();
  const [excluded, setExcluded] = useState<Set<number>>(new Set());
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<{ imported: number } | null>(null);
  const [busy, setBusy] = useState(false);
  const [drag, setDrag] = useState(false);

  async function check(fileId: string, m?: Mapping, s?: string) {
    setBusy(true);
    setError(null);
    try {
      const p = await api<Preview>(`/api/rigs/${rigId}/uploads/${fileId}/preview`, { body: { ...(m ? { mapping: m } : {}), ...(s ? { sheet: s } : {}) } });
      setPreview(p);
      setMapping(p.mapping);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }

  async function onFile(file: File) {
    setError(null);
    setDone(null);
    setPreview(null);
    setExcluded(new Set());
    if (file.size > maxMb * 1024 * 1024) {
      setError(`"${file.name}" is ${(file.size / 1024 / 1024).toFixed(1)} MB, over the ${maxMb} MB limit.`);
      return;
    }
    setProgress(0);
    try {
      const r = await uploadWithProgress(`/api/rigs/${rigId}/uploads?filename=${encodeURIComponent(file.name)}`, file, setProgress);
      setDuplicate(r.duplicate);
      await check(r.file.id);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The upload failed.');
    } finally {
      setProgress(null);
    }
  }

  function setColumn(col: number, header: string, field: Field | '', unit?: string) {
    if (!mapping) return;
    const others = mapping.columns.filter((c) => c.column !== col);
    const def = FIELDS.find((f) => f.id === field);
    const columns = field ? [...others, { column: col, header, field, ...(unit ?? def?.units[0] ? { unit: unit ?? def!.units[0] } : {}) }].sort((a, b) => a.column - b.column) : others;
    setMapping({ ...mapping, columns });
  }

  async function confirm() {
    if (!preview || !mapping) return;
    setBusy(true);
    setError(null);
    try {
      const r = await api<{ imported: number }>(`/api/rigs/${rigId}/uploads/${preview.file.id}/confirm`, { body: { mapping, excludedLines: [...excluded], ...(sheet ? { sheet } : {}) } });
      setDone(r);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }

  const errorLines = preview?.check ? [...new Set(preview.check.issues.filter((i) => i.severity === 'error').map((i) => i.line))] : [];
  const blocking = errorLines.filter((l) => !excluded.has(l));

  if (done) {
    return (
      <div role="status" className="card space-y-3 p-6">
        <p className="text-lg font-semibold text-ok-text">{done.imported} trials imported.</p>
        <Link className="btn-primary" href={`/rigs/${rigId}`}>
          See the trials
        </Link>
      </div>
    );
  }

  return (
    <div className="space-y-6">
      <label
        className={`card flex cursor-pointer flex-col items-center gap-2 border-2 border-dashed p-8 text-center ${drag ? 'border-ember-500 bg-ember-50' : 'border-paper-line'}`}
        onDragOver={(e) => {
          e.preventDefault();
          setDrag(true);
        }}
        onDragLeave={() => setDrag(false)}
        onDrop={(e) => {
          e.preventDefault();
          setDrag(false);
          const f = e.dataTransfer.files[0];
          if (f) void onFile(f);
        }}
      >
        <span className="text-lg font-semibold text-ink">Drop a trial sheet or a sensor log here, or choose a file</span>
        <span className="text-sm text-ink-muted">CSV, TSV, TXT or XLSX trial sheets; logger dumps as CSV, TSV or TXT; up to {maxMb} MB. The file is kept unchanged with its SHA-256.</span>
        <input type="file" aria-label="Trial file" className="sr-only" accept=".csv,.tsv,.txt,.xlsx" onChange={(e) => e.target.files?.[0] && onFile(e.target.files[0])} />
      </label>
      {progress !== null ? (
        <div role="progressbar" aria-label="Upload" aria-valuenow={Math.round(progress * 100)} aria-valuemin={0} aria-valuemax={100} className="h-3 overflow-hidden rounded-full bg-paper-deep">
          <div className="h-full bg-ember-500 transition-all" style={{ width: `${Math.round(progress * 100)}%` }} />
        </div>
      ) : null}
      {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">{error}</p> : null}
      {preview && mapping ? (
        <>
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
            <div className="overflow-x-auto">
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
          {mapping.shape === 'sensorLog' && preview.logHead && preview.mapping.shape === 'sensorLog' ? (
            <>
              <section className="card space-y-3 p-4" aria-labelledby="head-h">
                <h2 id="head-h" className="text-lg">First samples, converted</h2>
                {preview.logHead.rows.length ? <ConvertedRows rows={preview.logHead.rows} units={units} tempDigits={2} /> : null}
                <TemperatureCautions units={units} label="Cautions for these samples" places={[{ where: 'logged outlet', valuesC: preview.logHead.rows.map((r) => r.outletTempC) }, { where: 'logged inlet', valuesC: preview.logHead.rows.map((r) => r.inletTempC) }]} />
                {preview.logHead.issues.length ? (
                  <ul className="text-sm text-danger-text">
                    {preview.logHead.issues.slice(0, 5).map((i) => (
                      <li key={i.line}>
                        line {i.line}
                        {i.column ? ` (${i.column})` : ''}: {i.message}
                      </li>
                    ))}
                  </ul>
                ) : null}
                {preview.logHead.notices.map((n) => (
                  <p key={n} className="text-sm text-caution-text">{n}</p>
                ))}
              </section>
              <LogPeriods key={JSON.stringify(preview.mapping)} rigId={rigId} fileId={preview.file.id} fileState={preview.file.state} mapping={preview.mapping as Mapping & { shape: 'sensorLog' }} units={units} />
            </>
          ) : null}
          {mapping.shape === 'trialSheet' && preview.check ? (
            <section className="card space-y-3 p-4" aria-labelledby="check-h">
              <h2 id="check-h" className="text-lg">Check</h2>
              <p className="text-sm">
                <span className="num text-ok-text">{preview.check.okCount}</span> rows ready, <span className="num text-danger-text">{preview.check.errorCount}</span> with errors,{' '}
                <span className="num text-caution-text">{preview.check.warningCount}</span> with warnings.
              </p>
              {preview.check.notices.map((n) => (
                <p key={n} className="text-sm text-caution-text">{n}</p>
              ))}
              {preview.check.preview.some((r) => r.ok) ? (
                <ConvertedRows
                  caption="First rows, converted"
                  rows={preview.check.preview.flatMap((r) => (r.ok && r.row ? [{ line: r.line, ...r.row }] : []))}
                  units={units}
                  tempDigits={1}
                />
              ) : null}
              {preview.check.hottest?.outletTempC != null ? (
                <p className="text-sm">
                  Hottest outlet in the file: <span className="num"><TempValue tempC={preview.check.hottest.outletTempC} units={units} withUnit /></span>
                  {preview.check.hottest.outletLine != null ? <> (line <span className="num">{preview.check.hottest.outletLine}</span>)</> : null}.
                </p>
              ) : null}
              <TemperatureCautions units={units}
                label="Cautions for this file"
                places={[
                  { where: 'outlet', valuesC: [preview.check.hottest?.outletTempC, ...preview.check.preview.map((r) => r.row?.outletTempC)] },
                  { where: 'inlet', valuesC: [preview.check.hottest?.inletTempC, ...preview.check.preview.map((r) => r.row?.inletTempC)] },
                ]}
              />
              {preview.check.issues.length ? (
                <table className="data-table" aria-label="Row problems">
                  <thead>
                    <tr>
                      <th scope="col">Exclude</th>
                      <th scope="col">Line</th>
                      <th scope="col">Column</th>
                      <th scope="col">Problem</th>
                    </tr>
                  </thead>
                  <tbody>
                    {preview.check.issues.map((i, k) => (
                      <tr key={k} className={i.severity === 'error' ? 'text-danger-text' : 'text-caution-text'}>
                        <td>
                          <input
                            type="checkbox"
                            aria-label={`Exclude line ${i.line}`}
                            checked={excluded.has(i.line)}
                            onChange={(e) => {
                              const next = new Set(excluded);
                              if (e.target.checked) next.add(i.line);
                              else next.delete(i.line);
                              setExcluded(next);
                            }}
                          />
                        </td>
                        <td className="num">{i.line}</td>
                        <td>{i.column ?? ''}</td>
                        <td>
                          {i.severity === 'warning' ? 'warning: ' : ''}
                          {i.message}
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              ) : null}
              {blocking.length ? (
                <p className="text-sm text-danger-text">
                  {blocking.length} line(s) with errors still included: fix the file or the mapping, or exclude them.{' '}
                  <button type="button" className="underline" onClick={() => setExcluded(new Set([...excluded, ...errorLines]))}>
                    Exclude all rows with errors
                  </button>
                </p>
              ) : null}
              <button type="button" className="btn-primary" disabled={busy || blocking.length > 0 || preview.file.state === 'imported'} onClick={confirm}>
                Import {preview.check.okCount - [...excluded].filter((l) => !errorLines.includes(l)).length} trials
              </button>
            </section>
          ) : null}
        </>
      ) : null}
    </div>
  );
}
