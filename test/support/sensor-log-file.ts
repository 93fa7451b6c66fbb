/**
 * The generated 1 Hz sensor log of the tests (and of the import benchmarks, which import it from
 * here: tests own their fixtures): plateaus of 1200 s whose set-points cycle through outlet
 * 30 + 3k °C (k = 0…6) and flow 9 + 3k L/min (k = 0…4), first-order transitions with a 60-s time
 * constant, ±0.02 K and ±0.2 % seeded noise. Our own generator: a steady trial of it must sit on
 * one of its set-points.
 */
import { createWriteStream, statSync } from 'node:fs';
import { once } from 'node:events';
import type { ConfirmedMappingInput } from '@/app/_lib/imports/apply-mapping';
import { mulberry32 } from '@/analysis/segment/synthetic-log';

export interface SensorLogFileOptions {
  rows: number;
  /** s between samples (default 1) */
  intervalS?: number;
  /** s per set-point (default 1200) */
  plateauS?: number;
  seed?: number;
  /** first timestamp (default 2026-06-01T08:00:00Z) */
  startIso?: string;
}

/** Header of the generated log. */
export const SENSOR_LOG_HEADER = 'timestamp,T_in [C],T_out [C],flow [l/min],ambient [C],pump [W],status';

/** The confirmed mapping of the generated log (what the import page suggests for it). */
export const SENSOR_LOG_MAPPING = {
  shape: 'sensorLog',
  decimal: '.',
  columns: [
    { column: 0, header: 'timestamp', field: 'time', unit: 'datetime' },
    { column: 1, header: 'T_in [C]', field: 'inletTemp', unit: 'degC' },
    { column: 2, header: 'T_out [C]', field: 'outletTemp', unit: 'degC' },
    { column: 3, header: 'flow [l/min]', field: 'flow', unit: 'L/min' },
    { column: 4, header: 'ambient [C]', field: 'ambientTemp', unit: 'degC' },
  ],
} as const satisfies ConfirmedMappingInput;

/**
 * Streams a CSV sensor log of plateaus (set-points cycling through outlet and flow values, first-
 * order transitions with a 60-s time constant, seeded noise) to `file`, in bounded memory.
 * @returns the number of bytes written
 */
export async function writeSensorLogCsv(file: string, o: SensorLogFileOptions): Promise<number> {
  const dt = o.intervalS ?? 1;
  const plateau = o.plateauS ?? 1200;
  const rnd = mulberry32(o.seed ?? 7);
  const t0 = Date.parse(o.startIso ?? '2026-06-01T08:00:00Z');
  const out = createWriteStream(file);
  const k = 1 - Math.exp(-dt / 60);
  let tin = 14.5, tout = 38, q = 15, ta = 19;
  let buf = `${SENSOR_LOG_HEADER}\n`;
  for (let i = 0; i < o.rows; i++) {
    const p = Math.floor((i * dt) / plateau);
    const setOut = 30 + (p % 7) * 3, setQ = 9 + (p % 5) * 3, setIn = 14.5 + (p % 3) * 0.2;
    tin += (setIn - tin) * k; tout += (setOut - tout) * k; q += (setQ - q) * Math.min(1, 4 * k);
    ta += (19 + 3 * Math.sin((i * dt) / 43200 * Math.PI) - ta) * 0.01;
    const stamp = new Date(t0 + i * dt * 1000).toISOString().slice(0, 19).replace('T', ' ');
    buf += `${stamp},${(tin + 0.02 * (2 * rnd() - 1)).toFixed(3)},${(tout + 0.02 * (2 * rnd() - 1)).toFixed(3)},${(q * (1 + 0.002 * (2 * rnd() - 1))).toFixed(4)},${(ta + 0.1 * (2 * rnd() - 1)).toFixed(2)},${Math.round(180 + q * 6)},ok\n`;
    if (buf.length > 1 << 16) { if (!out.write(buf)) await once(out, 'drain'); buf = ''; }
  }
  out.write(buf);
  out.end();
  await once(out, 'finish');
  return statSync(file).size;
}

