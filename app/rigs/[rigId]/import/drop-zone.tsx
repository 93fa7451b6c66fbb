'use client';

import { useState } from 'react';

/** Where a file is dropped or chosen, and the upload's progress bar. */
export function DropZone({ maxMb, progress, onFile }: { maxMb: number; progress: number | null; onFile: (file: File) => void }) {
  const [drag, setDrag] = useState(false);
  return (
    <>
      <label
        className={`card flex cursor-pointer flex-col items-center gap-2 border-2 border-dashed p-8 text-center ${drag ? 'border-ember-500 bg-ember-50' : 'border-paper-line'}`}
        onDragOver={(e) => {
          e.preventDefault();
          setDrag(true);
        }}
        onDragLeave={() => setDrag(false)}
        onDrop={(e) => {
          e.preventDefault();
          setDrag(false);
          const f = e.dataTransfer.files[0];
          if (f) void onFile(f);
        }}
      >
        <span className="text-lg font-semibold text-ink">Drop a trial sheet or a sensor log here, or choose a file</span>
        <span className="text-sm text-ink-muted">CSV, TSV, TXT or XLSX trial sheets; logger dumps as CSV, TSV or TXT; up to {maxMb} MB. The file is kept unchanged with its SHA-256.</span>
        <input type="file" aria-label="Trial file" className="sr-only" accept=".csv,.tsv,.txt,.xlsx" onChange={(e) => e.target.files?.[0] && onFile(e.target.files[0])} />
      </label>
      {progress !== null ? (
        <div role="progressbar" aria-label="Upload" aria-valuenow={Math.round(progress * 100)} aria-valuemin={0} aria-valuemax={100} className="h-3 overflow-hidden rounded-full bg-paper-deep">
          <div className="h-full bg-ember-500 transition-all" style={{ width: `${Math.round(progress * 100)}%` }} />
        </div>
      ) : null}
    </>
  );
}
