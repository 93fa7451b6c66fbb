'use client';

import Link from 'next/link';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { ColumnMapping } from './column-mapping';
import { DropZone } from './drop-zone';
import type { Mapping } from './import-types';
import { LogHead } from './log-head';
import { LogPeriods } from './log-periods';
import { SheetCheck } from './sheet-check';
import { useImportWizard } from './use-import-wizard';

/** Upload → map and check → confirm. Nothing is written as trials until the engineer confirms. */
export function ImportWizard({ rigId, units, maxMb }: { rigId: string; units: UnitSystem; maxMb: number }) {
  const wizard = useImportWizard(rigId, maxMb);
  const { progress, duplicate, preview, mapping, error, done } = wizard.state;

  if (done) {
    return (
      <div role="status" className="card space-y-3 p-6">
        <p className="text-lg font-semibold text-ok-text">{done.imported} trials imported.</p>
        <Link className="btn-primary" href={`/rigs/${rigId}`}>
          See the trials
        </Link>
      </div>
    );
  }

  return (
    <div className="space-y-6">
      <DropZone maxMb={maxMb} progress={progress} onFile={(f) => void wizard.upload(f)} />
      {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">{error}</p> : null}
      {preview && mapping ? (
        <>
          <ColumnMapping wizard={wizard} duplicate={duplicate} />
          {mapping.shape === 'sensorLog' && preview.logHead && preview.mapping.shape === 'sensorLog' ? (
            <>
              <LogHead logHead={preview.logHead} units={units} />
              <LogPeriods key={JSON.stringify(preview.mapping)} rigId={rigId} fileId={preview.file.id} fileState={preview.file.state} mapping={preview.mapping as Mapping & { shape: 'sensorLog' }} units={units} />
            </>
          ) : null}
          {mapping.shape === 'trialSheet' && preview.check ? <SheetCheck wizard={wizard} units={units} /> : null}
        </>
      ) : null}
    </div>
  );
}
