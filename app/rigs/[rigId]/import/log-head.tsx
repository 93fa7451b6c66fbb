import { TemperatureCautions } from '../../../_components/safety-notice';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { ConvertedRows } from './converted-rows';
import type { Preview } from './import-types';

/** The first samples of a sensor log, converted, with their cautions and the first problems. */
export function LogHead({ logHead, units }: { logHead: NonNullable<Preview['logHead']>; units: UnitSystem }) {
  return (
    <section className="card space-y-3 p-4" aria-labelledby="head-h">
      <h2 id="head-h" className="text-lg">First samples, converted</h2>
      {logHead.rows.length ? <ConvertedRows rows={logHead.rows} units={units} tempDigits={2} /> : null}
      <TemperatureCautions units={units} label="Cautions for these samples" places={[{ where: 'logged outlet', valuesC: logHead.rows.map((r) => r.outletTempC) }, { where: 'logged inlet', valuesC: logHead.rows.map((r) => r.inletTempC) }]} />
      {logHead.issues.length ? (
        <ul className="text-sm text-danger-text">
          {logHead.issues.slice(0, 5).map((i) => (
            <li key={i.line}>
              line {i.line}
              {i.column ? ` (${i.column})` : ''}: {i.message}
            </li>
          ))}
        </ul>
      ) : null}
      {logHead.notices.map((n) => (
        <p key={n} className="text-sm text-caution-text">{n}</p>
      ))}
    </section>
  );
}
