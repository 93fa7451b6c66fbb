/** The periods the engineer chooses from a sensor log, and how the page writes times. */
import type { PreviewPeriod } from '@/app/_lib/imports/sensor-preview';

/** A period the engineer keeps or drops; `measured` is the server's measurement of exactly this span. */
export interface Choice {
  id: string;
  label: string;
  startS: number;
  endS: number;
  use: boolean;
  from: 'found' | 'rejected';
  measured: PreviewPeriod | null;
}

export interface Mapping {
  shape: 'sensorLog';
  columns: { column: number; header: string; field: string; unit?: string }[];
  decimal: '.' | ',';
  dateOrder?: 'dmy' | 'mdy';
}

/** Rows of the periods table per page. */
export const PAGE = 50;
export const num = (x: number, d: number) => (Number.isFinite(x) ? x.toFixed(d) : '—');
export const minutes = (s: number) => Math.round((s / 60) * 100) / 100;
/** Clock time (UTC) of a sample, with the date when the log spans days; elapsed h:mm:ss when undated. */
export function clock(startIso: string | null, s: number, multiDay: boolean): string {
  if (!startIso) {
    const h = Math.floor(s / 3600), m = Math.floor((s % 3600) / 60), sec = Math.round(s % 60);
    return `+${h}:${String(m).padStart(2, '0')}:${String(sec).padStart(2, '0')}`;
  }
  const iso = new Date(Date.parse(startIso) + s * 1000).toISOString();
  return multiDay ? `${iso.slice(5, 10)} ${iso.slice(11, 19)}` : iso.slice(11, 19);
}
