'use client';

import { useReducer } from 'react';
import { api, ApiError } from '../../../_components/api';
import { FIELDS, type Field, type Mapping, type Preview } from './import-types';
import { uploadWithProgress } from './upload';

/** Everything the import page shows and edits, in one state. */
export interface WizardState {
  /** share of the upload sent, or null when none is running */
  progress: number | null;
  duplicate: boolean;
  preview: Preview | null;
  mapping: Mapping | null;
  sheet: string | undefined;
  /** lines of a trial sheet left out of the import */
  excluded: Set<number>;
  error: string | null;
  done: { imported: number } | null;
  busy: boolean;
}

type Action =
  | { type: 'patch'; patch: Partial<WizardState> }
  | { type: 'newFile' }
  | { type: 'checked'; preview: Preview }
  | { type: 'exclude'; lines: number[]; on: boolean };

const INITIAL: WizardState = { progress: null, duplicate: false, preview: null, mapping: null, sheet: undefined, excluded: new Set(), error: null, done: null, busy: false };

function reduce(s: WizardState, a: Action): WizardState {
  switch (a.type) {
    case 'patch':
      return { ...s, ...a.patch };
    case 'newFile':
      return { ...s, error: null, done: null, preview: null, excluded: new Set() };
    case 'checked':
      return { ...s, preview: a.preview, mapping: a.preview.mapping };
    case 'exclude': {
      const next = new Set(s.excluded);
      for (const l of a.lines) if (a.on) next.add(l); else next.delete(l);
      return { ...s, excluded: next };
    }
  }
}

const failure = (e: unknown, fallback: string) => (e instanceof ApiError ? e.message : fallback);

/**
 * The import page's state and its steps: upload → check with a mapping (again after each edit) →
 * confirm. Nothing is written as trials until `confirm`.
 */
export function useImportWizard(rigId: string, maxMb: number) {
  const [s, dispatch] = useReducer(reduce, INITIAL);
  const patch = (p: Partial<WizardState>) => dispatch({ type: 'patch', patch: p });

  async function check(fileId: string, m?: Mapping, sheet?: string) {
    patch({ busy: true, error: null });
    try {
      const p = await api<Preview>(`/api/rigs/${rigId}/uploads/${fileId}/preview`, { body: { ...(m ? { mapping: m } : {}), ...(sheet ? { sheet } : {}) } });
      dispatch({ type: 'checked', preview: p });
    } catch (e) {
      patch({ error: failure(e, 'The server could not be reached.') });
    } finally {
      patch({ busy: false });
    }
  }

  async function upload(file: File) {
    dispatch({ type: 'newFile' });
    if (file.size > maxMb * 1024 * 1024) {
      patch({ error: `"${file.name}" is ${(file.size / 1024 / 1024).toFixed(1)} MB, over the ${maxMb} MB limit.` });
      return;
    }
    patch({ progress: 0 });
    try {
      const r = await uploadWithProgress(`/api/rigs/${rigId}/uploads?filename=${encodeURIComponent(file.name)}`, file, (progress) => patch({ progress }));
      patch({ duplicate: r.duplicate });
      await check(r.file.id);
    } catch (e) {
      patch({ error: failure(e, 'The upload failed.') });
    } finally {
      patch({ progress: null });
    }
  }

  /** Maps column `col` to a field (with its first unit unless one is given); '' leaves it out. */
  function setColumn(col: number, header: string, field: Field | '', unit?: string) {
    if (!s.mapping) return;
    const others = s.mapping.columns.filter((c) => c.column !== col);
    const def = FIELDS.find((f) => f.id === field);
    const columns = field ? [...others, { column: col, header, field, ...(unit ?? def?.units[0] ? { unit: unit ?? def!.units[0] } : {}) }].sort((a, b) => a.column - b.column) : others;
    patch({ mapping: { ...s.mapping, columns } });
  }

  async function confirm() {
    if (!s.preview || !s.mapping) return;
    patch({ busy: true, error: null });
    try {
      const r = await api<{ imported: number }>(`/api/rigs/${rigId}/uploads/${s.preview.file.id}/confirm`, { body: { mapping: s.mapping, excludedLines: [...s.excluded], ...(s.sheet ? { sheet: s.sheet } : {}) } });
      patch({ done: r });
    } catch (e) {
      patch({ error: failure(e, 'The server could not be reached.') });
    } finally {
      patch({ busy: false });
    }
  }

  const setMapping = (mapping: Mapping) => patch({ mapping });
  const setSheet = (sheet: string) => patch({ sheet });
  const exclude = (lines: number[], on: boolean) => dispatch({ type: 'exclude', lines, on });
  return { state: s, check, upload, setColumn, setMapping, setSheet, exclude, confirm };
}

/** What the import page needs from the hook, for the leaves it renders. */
export type ImportWizardApi = ReturnType<typeof useImportWizard>;
