'use client';

import { useEffect, useMemo, useRef, useState } from 'react';
import { PRESETS, type PresetName, type SteadyCriteria } from '@/analysis/segment/steady-criteria';
import type { PreviewPeriod, SegmentPreview } from '@/app/_lib/imports/sensor-preview';
import { timeSeriesSegmentsPlot, type LogSegment } from '@/app/_lib/plots/time-series';
import { api, ApiError } from '../../../_components/api';
import { JobProgress } from '../../../_components/job-progress';
import { PlotFigure } from '../../../_components/plot-figure';
import { TempValue, TemperatureCautions } from '../../../_components/safety-notice';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

const PRESET_TEXT: Record<PresetName, { label: string; note: string }> = {
  laboratory: { label: 'Laboratory', note: 'After ASHRAE 93: outlet drifting under 0.05 K/min, inlet within ±1 K, flow within ±2 %, at least 15 min.' },
  collector: { label: 'Solar collector', note: 'After ISO 9806: flow within ±1 %, inlet within ±0.1 K, 30-s means checked against the period, at least 15 min.' },
  field: { label: 'Field (fires and burners)', note: 'Our field preset: outlet drifting under 0.15 K/min, flow varying under 2 %, at least 5 min after 3 loop transit times.' },
};

type Key = 'windowS' | 'maxOutletSlopeKPerS' | 'inletTolK' | 'flowTolFraction' | 'maxFlowCv' | 'ambientTolK' | 'minDurationS' | 'settlingS' | 'transitTimeS' | 'blockS';

/** The thresholds the page offers, each shown in a display unit (empty = not judged, where allowed). */
function thresholdRows(u: UnitSystem): { key: Key; label: string; unit: string; toShow: (si: number) => number; toSI: (v: number) => number; nullable: boolean }[] {
  const diff = displayUnits(u).tempDiff;
  const k = diff.from;
  const kInv = diff.to;
  return [
    { key: 'maxOutletSlopeKPerS', label: 'Outlet drift under', unit: `${diff.label}/min`, toShow: (x) => k(x) * 60, toSI: (v) => kInv(v) / 60, nullable: true },
    { key: 'inletTolK', label: 'Inlet within ±', unit: diff.label, toShow: k, toSI: kInv, nullable: true },
    { key: 'flowTolFraction', label: 'Flow within ±', unit: '%', toShow: (x) => x * 100, toSI: (v) => v / 100, nullable: true },
    { key: 'maxFlowCv', label: 'Flow variation (CV) under', unit: '%', toShow: (x) => x * 100, toSI: (v) => v / 100, nullable: true },
    { key: 'ambientTolK', label: 'Ambient within ±', unit: diff.label, toShow: k, toSI: kInv, nullable: true },
    { key: 'windowS', label: 'Judged over windows of', unit: 'min', toShow: (x) => x / 60, toSI: (v) => v * 60, nullable: false },
    { key: 'minDurationS', label: 'Shortest period', unit: 'min', toShow: (x) => x / 60, toSI: (v) => v * 60, nullable: false },
    { key: 'settlingS', label: 'Settling dropped from each start', unit: 'min', toShow: (x) => x / 60, toSI: (v) => v * 60, nullable: false },
    { key: 'transitTimeS', label: 'Loop transit time', unit: 's', toShow: (x) => x, toSI: (v) => v, nullable: true },
    { key: 'blockS', label: 'Block for standard errors', unit: 's', toShow: (x) => x, toSI: (v) => v, nullable: false },
  ];
}

/** A period the engineer keeps or drops; `measured` is the server's measurement of exactly this span. */
interface Choice {
  id: string;
  label: string;
  startS: number;
  endS: number;
  use: boolean;
  from: 'found' | 'rejected';
  measured: PreviewPeriod | null;
}

interface Mapping {
  shape: 'sensorLog';
  columns: { column: number; header: string; field: string; unit?: string }[];
  decimal: '.' | ',';
  dateOrder?: 'dmy' | 'mdy';
}

/** Rows of the periods table per page. */
const PAGE = 50;
const num = (x: number, d: number) => (Number.isFinite(x) ? x.toFixed(d) : '—');
const minutes = (s: number) => Math.round((s / 60) * 100) / 100;
/** Clock time (UTC) of a sample, with the date when the log spans days; elapsed h:mm:ss when undated. */
function clock(startIso: string | null, s: number, multiDay: boolean): string {
  if (!startIso) {
    const h = Math.floor(s / 3600), m = Math.floor((s % 3600) / 60), sec = Math.round(s % 60);
    return `+${h}:${String(m).padStart(2, '0')}:${String(sec).padStart(2, '0')}`;
  }
  const iso = new Date(Date.parse(startIso) + s * 1000).toISOString();
  return multiDay ? `${iso.slice(5, 10)} ${iso.slice(11, 19)}` : iso.slice(11, 19);
}

/**
 * Reads the preview stream of POST …/segments: progress lines, then the result or an error.
 * @throws ApiError with the server's message (422 for a bad mapping, file or threshold)
 */
async function fetchPreview(url: string, body: unknown, onProgress: (f: number) => void = () => undefined, signal?: AbortSignal): Promise<SegmentPreview> {
  const res = await fetch(url, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(body), credentials: 'same-origin', signal });
  if (!res.ok || !res.body) {
    const j = (await res.json().catch(() => ({}))) as { message?: string };
    throw new ApiError(res.status, j.message ?? `The log could not be read (${res.status}).`);
  }
  const reader = res.body.getReader();
  const dec = new TextDecoder();
  let buf = '';
  for (;;) {
    const { value, done } = await reader.read();
    if (value) buf += dec.decode(value, { stream: true });
    let nl: number;
    while ((nl = buf.indexOf('\n')) >= 0) {
      const line = buf.slice(0, nl);
      buf = buf.slice(nl + 1);
      if (!line.trim()) continue;
      const msg = JSON.parse(line) as { progress?: { bytesDone: number; bytesTotal: number }; result?: SegmentPreview; error?: { status: number; message: string } };
      if (msg.progress) onProgress(msg.progress.bytesTotal > 0 ? msg.progress.bytesDone / msg.progress.bytesTotal : 0);
      if (msg.error) throw new ApiError(msg.error.status, msg.error.message);
      if (msg.result) return msg.result;
    }
    if (done) break;
  }
  throw new ApiError(0, 'The server stopped before the log was read; try again.');
}

/**
 * The sensor-log half of the import page: thresholds, the steady periods on a time-series plot,
 * accept / adjust / drop each (or take a rejected run anyway), then the background import with its
 * progress. Nothing is stored until "Import".
 */
export function LogPeriods({ rigId, fileId, fileState, mapping, units }: { rigId: string; fileId: string; fileState: string; mapping: Mapping; units: UnitSystem }) {
  const [preset, setPreset] = useState<PresetName>('field');
  const [edits, setEdits] = useState<Partial<Record<Key, number | null>>>({});
  const [preview, setPreview] = useState<SegmentPreview | null>(null);
  const [choices, setChoices] = useState<Choice[]>([]);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [skipBad, setSkipBad] = useState(false);
  const [measuring, setMeasuring] = useState(false);
  const [jobId, setJobId] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [view, setView] = useState<{ startS: number; endS: number } | null>(null);
  const [viewSeries, setViewSeries] = useState<SegmentPreview['series'] | null>(null);
  const [page, setPage] = useState(0);
  const abort = useRef<AbortController | null>(null);
  const rows = useMemo(() => thresholdRows(units), [units]);
  const base: SteadyCriteria = PRESETS[preset];

  const criteria = useMemo(() => {
    const out: Record<string, number | null> = {};
    for (const [k, v] of Object.entries(edits)) if (v !== undefined) out[k] = v;
    return out;
  }, [edits]);
  const url = `/api/rigs/${rigId}/uploads/${fileId}/segments`;

  async function find() {
    abort.current?.abort();
    const ac = new AbortController();
    abort.current = ac;
    setError(null);
    setProgress(0);
    try {
      const p = await fetchPreview(url, { mapping, preset, criteria }, setProgress, ac.signal);
      setPreview(p);
      setView(null);
      setViewSeries(null);
      setPage(0);
      setChoices([
        ...p.segments.map((s, i) => ({ id: `f${i}`, label: String(i + 1), startS: s.startS, endS: s.endS, use: true, from: 'found' as const, measured: s })),
      ]);
    } catch (e) {
      if (ac.signal.aborted) return;
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    } finally {
      if (abort.current === ac) setProgress(null);
    }
  }

  // changed spans are measured again on the server (the parsed log is cached there, so this is quick)
  const stale = choices.some((c) => c.use && !c.measured);
  const spans = JSON.stringify(choices.filter((c) => c.use).map((c) => [c.startS, c.endS]));
  useEffect(() => {
    if (!preview || !stale) return;
    const t = setTimeout(async () => {
      const used = choices.filter((c) => c.use);
      setMeasuring(true);
      setError(null);
      try {
        const p = await fetchPreview(url, { mapping, preset, criteria, periods: used.map((c) => ({ startS: Math.max(0, c.startS), endS: c.endS })) });
        const byId = new Map(used.map((c, i) => [c.id, p.periods?.[i] ?? null]));
        setChoices((cs) => cs.map((c) => (byId.has(c.id) ? { ...c, measured: byId.get(c.id)!, startS: byId.get(c.id)?.startS ?? c.startS, endS: byId.get(c.id)?.endS ?? c.endS } : c)));
      } catch (e) {
        setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
      } finally {
        setMeasuring(false);
      }
    }, 500);
    return () => clearTimeout(t);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [spans, stale]);

  function setChoice(id: string, patch: Partial<Choice>) {
    setChoices((cs) => cs.map((c) => (c.id === id ? { ...c, ...patch, ...(patch.startS !== undefined || patch.endS !== undefined ? { measured: null } : {}) } : c)));
  }

  /** Plots a stretch of the log (null: all of it); the server reduces that stretch anew. */
  async function zoom(next: { startS: number; endS: number } | null) {
    setView(next);
    if (!next) { setViewSeries(null); return; }
    setError(null);
    try {
      const r = await fetchPreview(url, { mapping, preset, criteria, view: next, seriesOnly: true });
      setViewSeries(r.series);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    }
  }

  async function startImport() {
    const used = choices.filter((c) => c.use && c.measured);
    setBusy(true);
    setError(null);
    try {
      const r = await api<{ job: { id: string } }>(`/api/rigs/${rigId}/uploads/${fileId}/log-import`, {
        body: { mapping, preset, criteria, skipInvalidRows: skipBad, segments: used.map((c) => ({ startLine: c.measured!.startLine, endLine: c.measured!.endLine })) },
      });
      setJobId(r.job.id);
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }

  const figures = useMemo(() => {
    if (!preview) return null;
    const s = viewSeries ?? preview.series;
    const points = s.tS.map((t, i) => ({ tS: t, inletTempC: s.inletTempC[i], outletTempC: s.outletTempC[i], flowM3PerS: s.flowM3PerS[i] }));
    const segments: LogSegment[] = [
      ...choices.map((c) => ({ startS: c.startS, endS: c.endS, label: c.from === 'rejected' ? `${c.label}*` : c.label, muted: !c.use })),
      ...preview.rejected.filter((r) => !choices.some((c) => c.id === `r${r.startLine}`)).map((r) => ({ startS: r.startS, endS: r.endS, label: '×', muted: true })),
    ];
    return timeSeriesSegmentsPlot({ points, segments, origin: preview.startIso ? new Date(preview.startIso) : null }, units, { width: 1100 });
  }, [preview, viewSeries, choices, units]);

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
  const tooManyBad = preview ? preview.rejectedCount > preview.issues.length : false;

  return (
    <section className="card space-y-4 p-4" aria-labelledby="periods-h">
      <h2 id="periods-h" className="text-lg">Steady periods</h2>
      <p className="text-sm text-ink-soft">
        Each steady period of the log becomes one trial (its means, with standard errors from 30-s blocks); every sample is kept with it. Choose the criteria, look at the periods on the plot, then keep, adjust or drop each one.
      </p>
      <div className="flex flex-wrap items-end gap-4">
        <label className="block">
          <span className="field-label">Criteria</span>
          <select aria-label="Criteria preset" className="field-input" value={preset} onChange={(e) => { setPreset(e.target.value as PresetName); setEdits({}); }}>
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
                    if (t === '') { setEdits((x) => ({ ...x, [r.key]: r.nullable ? null : base[r.key] as number })); return; }
                    const v = Number(t);
                    if (!Number.isFinite(v)) { setError(`${r.label}: "${e.target.value}" is not a number.`); return; }
                    setEdits((x) => ({ ...x, [r.key]: r.toSI(v) }));
                  }}
                />
              </label>
            );
          })}
        </div>
        {Object.keys(edits).length ? (
          <button type="button" className="btn-quiet mt-3" onClick={() => setEdits({})}>
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
      {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">{error}</p> : null}
      {preview && figures ? (
        <div className="space-y-4">
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
                <input type="checkbox" checked={skipBad} onChange={(e) => setSkipBad(e.target.checked)} />
                {preview.rejectedCount === 1 ? 'Leave this row out of the import' : `Leave these ${preview.rejectedCount.toLocaleString('en')} rows out of the import`}
              </label>
              <p className="text-xs">The file is kept as it is; the rows left out are counted with the import. A column mapped wrongly also makes rows fail: check the mapping first.</p>
            </div>
          ) : null}
          <div className="flex flex-wrap items-end gap-3 text-sm" role="group" aria-label="Plotted stretch">
            <span className="pb-2 text-ink-soft">{view ? `Showing ${num(view.startS / 3600, 2)}–${num(view.endS / 3600, 2)} h of ${num(preview.durationS / 3600, 2)} h` : 'Showing the whole log'}</span>
            <form
              className="flex items-end gap-2"
              onSubmit={(e) => {
                e.preventDefault();
                const f = new FormData(e.currentTarget);
                const a = Number(String(f.get('from')).replace(',', '.')) * 3600, b = Number(String(f.get('to')).replace(',', '.')) * 3600;
                if (!(Number.isFinite(a) && Number.isFinite(b) && b > a)) { setError('Zoom: give a start and a later end, in hours from the start of the log.'); return; }
                void zoom({ startS: a, endS: b });
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
              <button type="button" className="btn-quiet" onClick={() => void zoom(null)}>
                Whole log
              </button>
            ) : null}
          </div>
          <PlotFigure svg="" options={figures.temperatures.options} title={figures.temperatures.title} summary={figures.temperatures.summary} cautions={figures.temperatures.cautions} filename="log-temperatures" />
          <PlotFigure svg="" options={figures.flow.options} title={figures.flow.title} summary={figures.flow.summary} filename="log-flow" />
          <div className="overflow-x-auto">
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
                        <input type="checkbox" aria-label={`Keep period ${c.label}`} checked={c.use} onChange={(e) => setChoice(c.id, { use: e.target.checked })} />
                      </td>
                      <td className="num">
                        <button
                          type="button"
                          className="underline decoration-dotted"
                          title="Plot this period and its surroundings"
                          aria-label={`Zoom to period ${c.label}`}
                          onClick={() => {
                            const pad = Math.max(300, (c.endS - c.startS) * 0.5);
                            void zoom({ startS: Math.max(0, c.startS - pad), endS: Math.min(preview.durationS, c.endS + pad) });
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
                              if (!Number.isFinite(v) || v < 0) { setError(`Period ${c.label}: "${e.target.value}" is not a time in minutes.`); return; }
                              if (Math.abs(v - minutes(c[k])) > 1e-9) setChoice(c.id, { [k]: v * 60 });
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
                <button type="button" className="btn-quiet" disabled={page === 0} onClick={() => setPage(page - 1)}>
                  Previous
                </button>
                <span className="num">
                  {page * PAGE + 1}–{Math.min(choices.length, (page + 1) * PAGE)} of {choices.length}
                </span>
                <button type="button" className="btn-quiet" disabled={(page + 1) * PAGE >= choices.length} onClick={() => setPage(page + 1)}>
                  Next
                </button>
              </>
            ) : null}
            {choices.length > 1 ? (
              <>
                <button type="button" className="btn-quiet" onClick={() => setChoices((cs) => cs.map((c) => ({ ...c, use: true })))}>
                  Keep all
                </button>
                <button type="button" className="btn-quiet" onClick={() => setChoices((cs) => cs.map((c) => ({ ...c, use: false })))}>
                  Drop all
                </button>
              </>
            ) : null}
          </div>
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
                        <button type="button" className="underline" onClick={() => setChoices((cs) => [...cs, { id, label: String(cs.length + 1), startS: r.startS, endS: r.endS, use: true, from: 'rejected' as const, measured: null }].sort((a, b) => a.startS - b.startS))}>
                          Use anyway
                        </button>
                      )}
                    </li>
                  );
                })}
              </ul>
            </details>
          ) : null}
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
