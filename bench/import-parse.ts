/**
 * `npm run bench -- import-parse [rows]`: writes a synthetic 1 Hz sensor log (1,000,000 rows,
 * about 55 MB) to a temporary folder, then reads it through the streaming path of the import —
 * decode, text blocks read by the fast row path (papaparse and the zod sample schema for the rows
 * it does not take), auto-mapping, conversion to SI — and segments it
 * with the field preset. Prints rows/s and peak RSS; the last line is the headline.
 *
 * `writeSensorLogCsv` is exported for the full import benchmark and for the fixture log.
 */
import { createReadStream, createWriteStream, mkdtempSync, rmSync, statSync } from 'node:fs';
import { once } from 'node:events';
import os from 'node:os';
import path from 'node:path';
import { openDelimited } from '@/app/_lib/imports/read-delimited';
import { suggestMapping } from '@/app/_lib/imports/auto-map';
import { createSensorLogBuilder } from '@/app/_lib/imports/sensor-log';
import type { ConfirmedMappingInput } from '@/app/_lib/imports/apply-mapping';
import { mulberry32 } from '@/analysis/segment/synthetic-log';
import { segmentLog } from '@/analysis/segment/segment-log';

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

async function main() {
  const rows = Number(process.argv[2] ?? 1_000_000);
  const dir = mkdtempSync(path.join(os.tmpdir(), 'emberline-import-'));
  const file = path.join(dir, 'sensor-log.csv');
  try {
    const bytes = await writeSensorLogCsv(file, { rows });
    console.log(`generated ${rows.toLocaleString('en')} rows, ${(bytes / 1e6).toFixed(1)} MB in ${file}`);
    const rssBefore = process.memoryUsage().rss;
    const start = performance.now();
    const src = await openDelimited(createReadStream(file, { highWaterMark: 1 << 16 }), { fileName: 'sensor-log.csv', maxBytes: 100e6 });
    const suggestion = suggestMapping(src.header, [], src.dialect.decimal);
    const mapping: ConfirmedMappingInput = {
      shape: 'sensorLog',
      decimal: src.dialect.decimal,
      columns: suggestion.columns.filter((c) => c.field).map((c) => ({ column: c.column, header: c.header, field: c.field!, unit: c.field === 'time' ? 'datetime' : c.unit ?? undefined })),
    };
    const builder = createSensorLogBuilder(mapping, src.header, { file: 'sensor-log.csv' }, { text: src.dialect });
    for await (const block of src.blocks()) builder.add(block);
    const log = builder.finish();
    const parsed = performance.now();
    const seg = segmentLog({ timeS: log.timeS, inletTempC: log.inletTempC, outletTempC: log.outletTempC, flowM3PerS: log.flowM3PerS, ambientTempC: log.ambientTempC }, 'field');
    const done = performance.now();
    const peakMB = process.resourceUsage().maxRSS / 1024;
    console.log(`parse + map + validate: ${log.n.toLocaleString('en')} samples accepted, ${log.rejectedCount} rejected, ${((parsed - start) / 1000).toFixed(2)} s`);
    console.log(`segment (field preset): ${seg.segments.length} steady segments, ${seg.rejected.length} rejected runs, ${(done - parsed).toFixed(0)} ms`);
    console.log(`rss before parsing ${(rssBefore / 1048576).toFixed(0)} MB, peak RSS ${peakMB.toFixed(0)} MB (target < 512 MB)`);
    console.log(`import-parse: ${Math.round(log.n / ((done - start) / 1000)).toLocaleString('en')} rows/s end to end (${rows.toLocaleString('en')} rows, peak RSS ${peakMB.toFixed(0)} MB)`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (process.argv[1] && path.basename(process.argv[1]) === 'import-parse.ts') {
  main().catch((e) => { console.error(e); process.exit(1); });
}
