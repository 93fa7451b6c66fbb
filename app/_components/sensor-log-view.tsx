import { PlotFigure } from './plot-figure';
import { TempValue, TemperatureCautions } from './safety-notice';
import type { BlockBody } from '../_contracts/study-blocks';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

/** A sensor log's view as a study block and the rig page show it. */
export type SensorLogBody = Extract<BlockBody, { type: 'sensor-log' }>;

const hours = (s: number) => (s >= 3600 ? `${(s / 3600).toFixed(1)} h` : `${(s / 60).toFixed(0)} min`);
/** file names for the figures' downloads, by title */
const figureFile = (title: string) => (/irradiance/i.test(title) ? 'sensor-log-irradiance' : /flow/i.test(title) ? 'sensor-log-flow' : 'sensor-log-temperatures');

/**
 * A sensor log from its stored overview: what it is, its plots (temperatures with the air, flow,
 * and a collector log's irradiance) with the steady segments shaded, and the segments' table.
 * No hooks: the study blocks (client) and the rig page (server) render it alike.
 */
export function SensorLogView({ log, units }: { log: SensorLogBody; units: UnitSystem }) {
  return (
    <div className="space-y-4">
      <p className="flex flex-wrap items-center gap-2 text-sm text-ink-soft">
        <strong className="text-ink">Sensor log of {log.rigName}</strong>
        {log.filename ? <span className="num">{log.filename}</span> : null}
        <span>
          from <span className="num">{log.startedAt.slice(0, 16).replace('T', ' ')} UTC</span>, <span className="num">{hours(log.durationS)}</span>,{' '}
          <span className="num">{log.samples.toLocaleString('en-US')}</span> samples ({log.shownPoints.toLocaleString('en-US')} drawn)
        </span>
      </p>
      {log.plots.map((p) => (
        <PlotFigure key={p.title} {...p} filename={figureFile(p.title)} />
      ))}
      {log.segments.length ? (
        <div className="relative overflow-x-auto" tabIndex={0}>
          <table className="data-table">
            <caption className="px-3 py-2 text-left text-sm font-semibold text-ink">
              Steady segments (means){log.segmentCount > log.segments.length ? `: the first ${log.segments.length} of ${log.segmentCount.toLocaleString('en-US')}` : ''}
            </caption>
            <thead>
              <tr>
                <th scope="col">#</th>
                <th scope="col">From (UTC)</th>
                <th scope="col" className="text-right">Minutes</th>
                <th scope="col" className="text-right">Flow ({displayUnits(units).flow.label})</th>
                <th scope="col" className="text-right">Inlet ({displayUnits(units).temp.label})</th>
                <th scope="col" className="text-right">Outlet ({displayUnits(units).temp.label})</th>
                <th scope="col" className="text-right">Rise ({displayUnits(units).tempDiff.label})</th>
              </tr>
            </thead>
            <tbody>
              {log.segments.map((s, i) => (
                <tr key={i}>
                  <td className="num">{i + 1}</td>
                  <td className="num">{new Date(Date.parse(log.startedAt) + s.startS * 1000).toISOString().slice(11, 19)}</td>
                  <td className="num text-right">{((s.endS - s.startS) / 60).toFixed(1)}</td>
                  <td className="num text-right">{displayUnits(units).flow.from(s.flowM3PerS).toFixed(2)}</td>
                  <td className="num text-right"><TempValue tempC={s.inletTempC} units={units} /></td>
                  <td className="num text-right"><TempValue tempC={s.outletTempC} units={units} /></td>
                  <td className="num text-right">{displayUnits(units).tempDiff.from(s.outletTempC - s.inletTempC).toFixed(1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <div className="mt-3">
            <TemperatureCautions units={units} label="Cautions for these segments" places={[{ where: 'outlet', valuesC: log.segments.map((s) => s.outletTempC) }, { where: 'inlet', valuesC: log.segments.map((s) => s.inletTempC) }]} />
          </div>
        </div>
      ) : (
        <p className="text-sm text-ink-muted">No steady segment in this log.</p>
      )}
    </div>
  );
}
