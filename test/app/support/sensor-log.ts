/**
 * A generated sensor log (bench/import-parse.ts `writeSensorLogCsv`: 1 Hz plateaus of 1200 s,
 * outlet 30 + 3k °C, flow 9 + 3k L/min, seeded noise) imported into a rig by the real
 * `importSensorLog`, reading a local file instead of object storage (as the import benchmark does).
 */
import { randomBytes } from 'node:crypto';
import { createReadStream, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { writeSensorLogCsv, SENSOR_LOG_HEADER } from '../../../bench/import-parse';
import { suggestMapping } from '@/app/_lib/import/auto-map';
import { getEm } from '@/app/_lib/db';
import { importSensorLog, logImportInput, type SensorImportResult } from '@/app/_lib/sensor-import';
import { Lab, Rig, SourceFile } from '@/entities';

/** The log's own header, mapped as the import wizard suggests it. */
function mapping() {
  const header = SENSOR_LOG_HEADER.split(',');
  const s = suggestMapping(header, [], '.');
  return {
    shape: 'sensorLog',
    decimal: '.',
    columns: s.columns.filter((c) => c.field).map((c) => ({ column: c.column, header: c.header, field: c.field!, unit: c.field === 'time' ? 'datetime' : c.unit ?? undefined })),
  };
}

/** Imports `rows` generated samples into the rig; returns the source file id and the import result. */
export async function importGeneratedLog(labId: string, rigId: string, rows: number, seed = 7): Promise<{ fileId: string; result: SensorImportResult }> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'emberline-study-log-'));
  try {
    const file = path.join(dir, 'pool-loop-log.csv');
    const bytes = await writeSensorLogCsv(file, { rows, seed });
    const em = await getEm();
    const lab = await em.findOneOrFail(Lab, { id: labId });
    const rig = await em.findOneOrFail(Rig, { id: rigId, lab });
    const source = em.create(SourceFile, {
      lab, rig, filename: 'pool-loop-log.csv', contentType: 'text/csv', sizeBytes: bytes, sha256: randomBytes(32).toString('hex'), storageKey: 'test/local-file',
    });
    await em.flush();
    const result = await importSensorLog(
      { fileId: source.id, rigId, labId, filename: source.filename, storageKey: source.storageKey, sizeBytes: bytes, uploadedAt: new Date() },
      logImportInput.parse({ mapping: mapping(), preset: 'field' }),
      { open: async () => createReadStream(file, { highWaterMark: 1 << 16 }) },
    );
    return { fileId: source.id, result };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
