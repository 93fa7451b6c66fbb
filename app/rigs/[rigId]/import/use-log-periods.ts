'use client';

import { useEffect, useMemo, useReducer, useRef } from 'react';
import { PRESETS, type PresetName, type SteadyCriteria } from '@/analysis/segment/steady-criteria';
import type { SegmentPreview } from '@/app/_lib/imports/sensor-preview';
import { timeSeriesSegmentsPlot, type LogSegment } from '@/app/_plots/time-series';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { api, ApiError } from '../../../_components/api';
import { fetchPreview } from './fetch-log-preview';
import type { Choice, Mapping } from './log-model';
import { thresholdRows, type Key } from './log-thresholds';

/** Everything the sensor-log half of the import page shows and edits. */
export interface LogPeriodsState {
  preset: PresetName;
  /** thresholds the engineer changed, SI (null: not judged) */
  edits: Partial<Record<Key, number | null>>;
  preview: SegmentPreview | null;
  choices: Choice[];
  /** share of the log read, or null when no reading runs */
  progress: number | null;
  error: string | null;
  skipBad: boolean;
  measuring: boolean;
  jobId: string | null;
  busy: boolean;
  /** the plotted stretch (null: the whole log) and its series, reduced anew by the server */
  view: { startS: number; endS: number } | null;
  viewSeries: SegmentPreview['series'] | null;
  page: number;
}

type Action =
  | { type: 'patch'; patch: Partial<LogPeriodsState> }
  | { type: 'preset'; preset: PresetName }
  | { type: 'edit'; key: Key; value: number | null }
  | { type: 'found'; preview: SegmentPreview }
  | { type: 'choice'; id: string; patch: Partial<Choice> }
  | { type: 'measured'; byId: Map<string, Choice['measured']> }
  | { type: 'useAll'; use: boolean }
  | { type: 'take'; run: SegmentPreview['rejected'][number] };

const INITIAL: LogPeriodsState = { preset: 'field', edits: {}, preview: null, choices: [], progress: null, error: null, skipBad: false, measuring: false, jobId: null, busy: false, view: null, viewSeries: null, page: 0 };

function reduce(s: LogPeriodsState, a: Action): LogPeriodsState {
  switch (a.type) {
    case 'patch':
      return { ...s, ...a.patch };
    case 'preset':
      return { ...s, preset: a.preset, edits: {} };
    case 'edit':
      return { ...s, edits: { ...s.edits, [a.key]: a.value } };
    case 'found':
      return {
        ...s, preview: a.preview, view: null, viewSeries: null, page: 0,
        choices: a.preview.segments.map((seg, i) => ({ id: `f${i}`, label: String(i + 1), startS: seg.startS, endS: seg.endS, use: true, from: 'found' as const, measured: seg })),
      };
    case 'choice':
      // a moved start or end needs measuring again
      return { ...s, choices: s.choices.map((c) => (c.id === a.id ? { ...c, ...a.patch, ...(a.patch.startS !== undefined || a.patch.endS !== undefined ? { measured: null } : {}) } : c)) };
    case 'measured':
      return { ...s, choices: s.choices.map((c) => (a.byId.has(c.id) ? { ...c, measured: a.byId.get(c.id)!, startS: a.byId.get(c.id)?.startS ?? c.startS, endS: a.byId.get(c.id)?.endS ?? c.endS } : c)) };
    case 'useAll':
      return { ...s, choices: s.choices.map((c) => ({ ...c, use: a.use })) };
    case 'take':
      return { ...s, choices: [...s.choices, { id: `r${a.run.startLine}`, label: String(s.choices.length + 1), startS: a.run.startS, endS: a.run.endS, use: true, from: 'rejected' as const, measured: null }].sort((x, y) => x.startS - y.startS) };
  }
}

const failure = (e: unknown) => (e instanceof ApiError ? e.message : 'The server could not be reached.');

/**
 * The state and the steps of the sensor-log import: find the periods with a preset and edited
 * thresholds, measure the spans the engineer moved (again on the server, where the parsed log is
 * cached), zoom the plot, then start the background import. Nothing is stored until `startImport`.
 */
export function useLogPeriods({ rigId, fileId, mapping, units }: { rigId: string; fileId: string; mapping: Mapping; units: UnitSystem }) {
  const [s, dispatch] = useReducer(reduce, INITIAL);
  const patch = (p: Partial<LogPeriodsState>) => dispatch({ type: 'patch', patch: p });
  const abort = useRef<AbortController | null>(null);
  const rows = useMemo(() => thresholdRows(units), [units]);
  const base: SteadyCriteria = PRESETS[s.preset];
  const criteria = useMemo(() => {
    const out: Record<string, number | null> = {};
    for (const [k, v] of Object.entries(s.edits)) if (v !== undefined) out[k] = v;
    return out;
  }, [s.edits]);
  const url = `/api/rigs/${rigId}/uploads/${fileId}/segments`;
  const { preset, preview, choices } = s;

  async function find() {
    abort.current?.abort();
    const ac = new AbortController();
    abort.current = ac;
    patch({ error: null, progress: 0 });
    try {
      const p = await fetchPreview(url, { mapping, preset, criteria }, (progress) => patch({ progress }), ac.signal);
      dispatch({ type: 'found', preview: p });
    } catch (e) {
      if (ac.signal.aborted) return;
      patch({ error: failure(e) });
    } finally {
      if (abort.current === ac) patch({ progress: null });
    }
  }

  // changed spans are measured again on the server (the parsed log is cached there, so this is quick)
  const stale = choices.some((c) => c.use && !c.measured);
  const spans = JSON.stringify(choices.filter((c) => c.use).map((c) => [c.startS, c.endS]));
  useEffect(() => {
    if (!preview || !stale) return;
    const t = setTimeout(async () => {
      const used = choices.filter((c) => c.use);
      patch({ measuring: true, error: null });
      try {
        const p = await fetchPreview(url, { mapping, preset, criteria, periods: used.map((c) => ({ startS: Math.max(0, c.startS), endS: c.endS })) });
        dispatch({ type: 'measured', byId: new Map(used.map((c, i) => [c.id, p.periods?.[i] ?? null])) });
      } catch (e) {
        patch({ error: failure(e) });
      } finally {
        patch({ measuring: false });
      }
    }, 500);
    return () => clearTimeout(t);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [spans, stale]);

  /** Plots a stretch of the log (null: all of it); the server reduces that stretch anew. */
  async function zoom(next: { startS: number; endS: number } | null) {
    patch({ view: next });
    if (!next) { patch({ viewSeries: null }); return; }
    patch({ error: null });
    try {
      const r = await fetchPreview(url, { mapping, preset, criteria, view: next, seriesOnly: true });
      patch({ viewSeries: r.series });
    } catch (e) {
      patch({ error: failure(e) });
    }
  }

  async function startImport() {
    const used = choices.filter((c) => c.use && c.measured);
    patch({ busy: true, error: null });
    try {
      const r = await api<{ job: { id: string } }>(`/api/rigs/${rigId}/uploads/${fileId}/log-import`, {
        body: { mapping, preset, criteria, skipInvalidRows: s.skipBad, segments: used.map((c) => ({ startLine: c.measured!.startLine, endLine: c.measured!.endLine })) },
      });
      patch({ jobId: r.job.id });
    } catch (e) {
      patch({ error: failure(e) });
    } finally {
      patch({ busy: false });
    }
  }

  const figures = useMemo(() => {
    if (!preview) return null;
    const series = s.viewSeries ?? preview.series;
    const points = series.tS.map((t, i) => ({
      tS: t, inletTempC: series.inletTempC[i], outletTempC: series.outletTempC[i], flowM3PerS: series.flowM3PerS[i],
      ...(series.ambientTempC ? { ambientTempC: series.ambientTempC[i] } : {}), ...(series.irradianceWPerM2 ? { irradianceWPerM2: series.irradianceWPerM2[i] } : {}),
    }));
    const segments: LogSegment[] = [
      ...choices.map((c) => ({ startS: c.startS, endS: c.endS, label: c.from === 'rejected' ? `${c.label}*` : c.label, muted: !c.use })),
      ...preview.rejected.filter((r) => !choices.some((c) => c.id === `r${r.startLine}`)).map((r) => ({ startS: r.startS, endS: r.endS, label: '×', muted: true })),
    ];
    return timeSeriesSegmentsPlot({ points, segments, origin: preview.startIso ? new Date(preview.startIso) : null }, units, { width: 1100 });
  }, [preview, s.viewSeries, choices, units]);

  return {
    state: s, rows, base, stale, figures, find, zoom, startImport,
    setPreset: (p: PresetName) => dispatch({ type: 'preset', preset: p }),
    editThreshold: (key: Key, value: number | null) => dispatch({ type: 'edit', key, value }),
    resetThresholds: () => patch({ edits: {} }),
    fail: (error: string) => patch({ error }),
    setChoice: (id: string, p: Partial<Choice>) => dispatch({ type: 'choice', id, patch: p }),
    useAll: (use: boolean) => dispatch({ type: 'useAll', use }),
    take: (run: SegmentPreview['rejected'][number]) => dispatch({ type: 'take', run }),
    setPage: (page: number) => patch({ page }),
    setSkipBad: (skipBad: boolean) => patch({ skipBad }),
  };
}

/** What the leaves of the sensor-log import read and call. */
export type LogPeriodsApi = ReturnType<typeof useLogPeriods>;
