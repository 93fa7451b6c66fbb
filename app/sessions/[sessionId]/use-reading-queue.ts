'use client';

import { useCallback, useEffect, useRef, useState } from 'react';
import { api, ApiError } from '../../_components/api';

/** A reading as the phone sends it (the API's trial shape with the phone's id and the run). */
export interface QueuedReading {
  id: string;
  runKey: string;
  startedAt: string;
  inlet: string;
  outlet: string;
  bucketVolume?: string;
  fillTimesS?: number[];
  flow?: string;
  notes?: string;
}

export interface ReadingAnswer<S> {
  session: S;
  check: { inside: boolean; message: string } | null;
  drift: { ready: boolean; drifted: boolean; message: string } | null;
  warnings: string[];
}

/**
 * The phone's queue of readings: each reading is written to localStorage before it is sent, sent
 * in order, and taken off only when the server has it (201, or 200 for one it already had: the id
 * is the phone's, so a retry never makes a second trial). Without signal the readings wait and go
 * when the phone is back online. A reading the server refuses (the trial rule) is taken off and
 * handed back with the message.
 */
export function useReadingQueue<S>(sessionId: string, onSaved: (a: ReadingAnswer<S>, r: QueuedReading) => void, onRefused: (r: QueuedReading, e: ApiError) => void) {
  const key = `emberline.session.${sessionId}.readings`;
  const [queue, setQueue] = useState<QueuedReading[]>([]);
  const [offline, setOffline] = useState(false);
  const busy = useRef(false);
  const cb = useRef({ onSaved, onRefused });
  useEffect(() => {
    cb.current = { onSaved, onRefused };
  });

  const read = useCallback((): QueuedReading[] => {
    try {
      const v = JSON.parse(localStorage.getItem(key) ?? '[]');
      return Array.isArray(v) ? v : [];
    } catch {
      return [];
    }
  }, [key]);
  const write = useCallback((q: QueuedReading[]) => {
    localStorage.setItem(key, JSON.stringify(q));
    setQueue(q);
  }, [key]);

  const flush = useCallback(async () => {
    if (busy.current) return;
    busy.current = true;
    try {
      for (;;) {
        const q = read();
        if (!q.length) break;
        const r = q[0];
        try {
          const a = await api<ReadingAnswer<S>>(`/api/sessions/${sessionId}/readings`, { body: r });
          write(read().filter((x) => x.id !== r.id));
          setOffline(false);
          cb.current.onSaved(a, r);
        } catch (e) {
          if (e instanceof ApiError && e.status >= 400 && e.status < 500 && e.status !== 408 && e.status !== 429) {
            write(read().filter((x) => x.id !== r.id));
            cb.current.onRefused(r, e);
            continue;
          }
          setOffline(true);
          break;
        }
      }
    } finally {
      busy.current = false;
    }
  }, [read, write, sessionId]);

  useEffect(() => {
    // what an earlier visit left on the phone (read after the first render: the server knows nothing of it)
    const load = setTimeout(() => { setQueue(read()); void flush(); }, 0);
    const online = () => void flush();
    window.addEventListener('online', online);
    const retry = setInterval(() => { if (read().length) void flush(); }, 15_000);
    return () => {
      clearTimeout(load);
      window.removeEventListener('online', online);
      clearInterval(retry);
    };
  }, [read, flush]);

  const add = useCallback((r: QueuedReading) => {
    write([...read(), r]);
    void flush();
  }, [read, write, flush]);

  return { queue, offline, add, flush };
}
