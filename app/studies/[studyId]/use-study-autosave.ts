'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useReducer, useRef } from 'react';
import { useSWRConfig } from 'swr';
import { api, ApiError } from '../../_components/api';
import type { StudyRecord } from '../../_contracts/study-blocks';
import { studyBlockKey, studyKey } from '../../_contracts/study-keys';
import { changedBlocks, type Block, type StudyState } from './study-blocks-model';

export type SaveStatus = 'saved' | 'pending' | 'saving' | 'conflict' | 'error';

interface EditorState {
  study: StudyState;
  status: SaveStatus;
  message: string | null;
  /** the other editor's version after a 409, until the engineer chooses */
  theirs: StudyRecord['study'] | null;
}

type Action =
  | { type: 'edit'; patch: Partial<StudyState> }
  | { type: 'saving' }
  | { type: 'saved'; revision: number; more: boolean }
  | { type: 'conflict'; theirs: StudyRecord['study']; message: string }
  | { type: 'failed'; message: string }
  | { type: 'takeTheirs' }
  | { type: 'keepMine' };

function reduce(s: EditorState, a: Action): EditorState {
  switch (a.type) {
    case 'edit':
      return { ...s, study: { ...s.study, ...a.patch }, status: 'pending' };
    case 'saving':
      return { ...s, status: 'saving' };
    case 'saved':
      return { ...s, study: { ...s.study, revision: a.revision }, status: a.more ? 'pending' : 'saved', message: null };
    case 'conflict':
      return { ...s, theirs: a.theirs, status: 'conflict', message: a.message };
    case 'failed':
      return { ...s, status: 'error', message: a.message };
    case 'takeTheirs':
      return s.theirs ? { study: { title: s.theirs.title, blocks: s.theirs.blocks as Block[], revision: s.theirs.revision }, theirs: null, status: 'saved', message: null } : s;
    case 'keepMine':
      return s.theirs ? { ...s, study: { ...s.study, revision: s.theirs.revision }, theirs: null, status: 'pending' } : s;
  }
}

/**
 * A study being edited, saved automatically 800 ms after the last change against the revision it
 * loaded. When someone else saved in between, nothing is overwritten: `theirs` holds their version
 * until the engineer takes it or keeps theirs over it. After a save the study's SWR entry takes the
 * saved version and only the blocks whose settings changed fetch their data again.
 */
export function useStudyAutosave(studyId: string, initial: StudyState, initialReviewState: string) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const [s, dispatch] = useReducer(reduce, { study: initial, status: 'saved', message: null, theirs: null });
  const dirty = useRef(false);
  /** the blocks as last saved (or taken from the other editor), to find what changed */
  const shown = useRef<Block[]>(initial.blocks);
  const reviewState = useRef(initialReviewState);

  /** Puts a saved version into the study's SWR entry and refreshes the blocks it changed. */
  const publish = (study: StudyRecord['study']) => {
    const changed = changedBlocks(shown.current, study.blocks as Block[]);
    shown.current = study.blocks as Block[];
    void mutate(studyKey(studyId), (old?: StudyRecord) => ({ ...old, study }), { revalidate: false });
    for (const id of changed) void mutate(studyBlockKey(studyId, id));
    // an edit sends an approved study back to draft: the review panel (server-rendered) shows it
    if (study.reviewState !== reviewState.current) router.refresh();
    reviewState.current = study.reviewState;
  };

  const change = (patch: Partial<StudyState>) => {
    dispatch({ type: 'edit', patch });
    dirty.current = true;
  };

  const { status, study } = s;
  useEffect(() => {
    if (status !== 'pending') return;
    const t = setTimeout(async () => {
      if (!dirty.current) return;
      dirty.current = false;
      dispatch({ type: 'saving' });
      try {
        const r = await api<StudyRecord>(`/api/studies/${studyId}`, { method: 'PUT', body: { title: study.title, blocks: study.blocks, baseRevision: study.revision } });
        dispatch({ type: 'saved', revision: r.study.revision, more: dirty.current });
        publish(r.study);
      } catch (e) {
        if (e instanceof ApiError && e.status === 409 && e.body.current) {
          dispatch({ type: 'conflict', theirs: e.body.current as StudyRecord['study'], message: e.message });
        } else {
          dispatch({ type: 'failed', message: e instanceof ApiError ? [e.message, ...Object.values(e.fields)].join(' ') : 'Not saved: the server could not be reached. Your edits stay here; they save when it answers.' });
          dirty.current = true;
        }
      }
    }, 800);
    return () => clearTimeout(t);
    // publish is recreated each render and reads only refs, the stable mutate and the router
  }, [status, study, studyId]); // eslint-disable-line react-hooks/exhaustive-deps

  function takeTheirs() {
    if (!s.theirs) return;
    const theirs = s.theirs;
    dispatch({ type: 'takeTheirs' });
    publish(theirs);
  }

  function keepMine() {
    dirty.current = true;
    dispatch({ type: 'keepMine' });
  }

  return { ...s, change, takeTheirs, keepMine };
}
