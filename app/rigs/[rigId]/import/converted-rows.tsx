import { TempValue } from '../../../_components/safety-notice';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';


/** The first rows of a file converted to the user's units (with the log's time from its start when given). */
export function ConvertedRows({ rows, units, tempDigits, caption }: { rows: { line: number; timeS?: number; flowM3PerS: number; inletTempC: number; outletTempC: number }[]; units: UnitSystem; tempDigits: number; caption?: string }) {
  const timed = rows.some((r) => r.timeS !== undefined);
  return (
    <table className="data-table">
      {caption ? <caption className="py-1 text-left text-sm font-semibold">{caption}</caption> : null}
      <thead>
        <tr>
          <th scope="col">Line</th>
          {timed ? <th scope="col" className="text-right">Time (s)</th> : null}
          <th scope="col" className="text-right">Flow ({displayUnits(units).flow.label})</th>
          <th scope="col" className="text-right">Inlet ({displayUnits(units).temp.label})</th>
          <th scope="col" className="text-right">Outlet ({displayUnits(units).temp.label})</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.line}>
            <td className="num">{r.line}</td>
            {timed ? <td className="num text-right">{r.timeS?.toFixed(1)}</td> : null}
            <td className="num text-right">{displayUnits(units).flow.from(r.flowM3PerS).toFixed(2)}</td>
            <td className="num text-right"><TempValue tempC={r.inletTempC} units={units} digits={tempDigits} /></td>
            <td className="num text-right"><TempValue tempC={r.outletTempC} units={units} digits={tempDigits} /></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
