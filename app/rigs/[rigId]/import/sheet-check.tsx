'use client';

import { TempValue, TemperatureCautions } from '../../../_components/safety-notice';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { ConvertedRows } from './converted-rows';
import type { ImportWizardApi } from './use-import-wizard';

/**
 * The check of a trial sheet: counts, the first rows converted, the hottest outlet and the
 * cautions, each row's problems with a box to exclude it, and "Import n trials".
 */
export function SheetCheck({ wizard, units }: { wizard: ImportWizardApi; units: UnitSystem }) {
  const { preview, excluded, busy } = wizard.state;
  const { confirm } = wizard;
  if (!preview?.check) return null;
  const errorLines = [...new Set(preview.check.issues.filter((i) => i.severity === 'error').map((i) => i.line))];
  const blocking = errorLines.filter((l) => !excluded.has(l));
  return (
    <section className="card space-y-3 p-4" aria-labelledby="check-h">
      <h2 id="check-h" className="text-lg">Check</h2>
      <p className="text-sm">
        <span className="num text-ok-text">{preview.check.okCount}</span> rows ready, <span className="num text-danger-text">{preview.check.errorCount}</span> with errors,{' '}
        <span className="num text-caution-text">{preview.check.warningCount}</span> with warnings.
      </p>
      {preview.check.notices.map((n) => (
        <p key={n} className="text-sm text-caution-text">{n}</p>
      ))}
      {preview.check.preview.some((r) => r.ok) ? (
        <ConvertedRows
          caption="First rows, converted"
          rows={preview.check.preview.flatMap((r) => (r.ok && r.row ? [{ line: r.line, ...r.row }] : []))}
          units={units}
          tempDigits={1}
        />
      ) : null}
      {preview.check.hottest?.outletTempC != null ? (
        <p className="text-sm">
          Hottest outlet in the file: <span className="num"><TempValue tempC={preview.check.hottest.outletTempC} units={units} withUnit /></span>
          {preview.check.hottest.outletLine != null ? <> (line <span className="num">{preview.check.hottest.outletLine}</span>)</> : null}.
        </p>
      ) : null}
      <TemperatureCautions units={units}
        label="Cautions for this file"
        places={[
          { where: 'outlet', valuesC: [preview.check.hottest?.outletTempC, ...preview.check.preview.map((r) => r.row?.outletTempC)] },
          { where: 'inlet', valuesC: [preview.check.hottest?.inletTempC, ...preview.check.preview.map((r) => r.row?.inletTempC)] },
        ]}
      />
      {preview.check.issues.length ? (
        <table className="data-table" aria-label="Row problems">
          <thead>
            <tr>
              <th scope="col">Exclude</th>
              <th scope="col">Line</th>
              <th scope="col">Column</th>
              <th scope="col">Problem</th>
            </tr>
          </thead>
          <tbody>
            {preview.check.issues.map((i, k) => (
              <tr key={k} className={i.severity === 'error' ? 'text-danger-text' : 'text-caution-text'}>
                <td>
                  <input
                    type="checkbox"
                    aria-label={`Exclude line ${i.line}`}
                    checked={excluded.has(i.line)}
                    onChange={(e) => wizard.exclude([i.line], e.target.checked)}
                  />
                </td>
                <td className="num">{i.line}</td>
                <td>{i.column ?? ''}</td>
                <td>
                  {i.severity === 'warning' ? 'warning: ' : ''}
                  {i.message}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
      {blocking.length ? (
        <p className="text-sm text-danger-text">
          {blocking.length} line(s) with errors still included: fix the file or the mapping, or exclude them.{' '}
          <button type="button" className="underline" onClick={() => wizard.exclude(errorLines, true)}>
            Exclude all rows with errors
          </button>
        </p>
      ) : null}
      <button type="button" className="btn-primary" disabled={busy || blocking.length > 0 || preview.file.state === 'imported'} onClick={confirm}>
        Import {preview.check.okCount - [...excluded].filter((l) => !errorLines.includes(l)).length} trials
      </button>
    </section>
  );
}
