/**
 * `npm run bench -- import-parse [rows]`: writes a synthetic 1 Hz sensor log (1,000,000 rows,
 * about 55 MB) to a temporary folder, then reads it through the streaming path of the import —
 * decode, text blocks read by the fast row path (papaparse and the zod sample schema for the rows
 * it does not take), auto-mapping, conversion to SI — and segments it
 * with the field preset. Prints rows/s and peak RSS; the last line is the headline.
 *
 * The log comes from `writeSensorLogCsv` (test/support/sensor-log-file.ts, the tests' own generator).
 */
import { createReadStream, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { openDelimited } from '@/app/_lib/imports/read-delimited';
import { suggestMapping } from '@/app/_lib/imports/auto-map';
import { createSensorLogBuilder } from '@/app/_lib/imports/sensor-log';
import type { ConfirmedMappingInput } from '@/app/_lib/imports/apply-mapping';
import { writeSensorLogCsv } from '../test/support/sensor-log-file';
import { segmentLog } from '@/analysis/segment/segment-log';

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
