'use client';

import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnit, displayUnits } from '@/app/_contracts/units';
import type { TubFillView } from '../_contracts/study-blocks';
import { CautionList, TempValue } from './safety-notice';

const hm = (s: number) => `${Math.floor(s / 3600)} h ${String(Math.round((s % 3600) / 60)).padStart(2, '0')} min`;

/** A tub filled in one pass (the forecast page's section and a study's tub-fill block): fill time, outlet, the tub when full, the flow for a target, the cautions. */
export function TubFillResultView({ fill: r, units, inputs = false }: { fill: TubFillView; units: UnitSystem; inputs?: boolean }) {
  const u = displayUnits(units);
  const vol = displayUnit('volume', units);
  return (
    <div className="space-y-3" data-testid="tub-fill">
      {inputs ? (
        <p className="text-sm text-ink-soft">
          <span className="num">{vol.from(r.tubVolumeM3).toLocaleString('en-US', { maximumFractionDigits: 0 })} {vol.label}</span> at{' '}
          <span className="num">{u.flow.from(r.flowM3PerS).toFixed(2)} {u.flow.label}</span> from a <TempValue tempC={r.supplyTempC} units={units} withUnit /> supply, in one pass through the heater (no recirculation).
        </p>
      ) : null}
      <dl className="grid gap-3 sm:grid-cols-3">
        <div><dt className="text-sm text-ink-soft">Fill time</dt><dd className="num text-xl">{hm(r.fillTimeS)}</dd></div>
        <div><dt className="text-sm text-ink-soft">Heater outlet</dt><dd className="num text-xl"><TempValue tempC={r.outletTempC} units={units} withUnit /></dd></div>
        <div><dt className="text-sm text-ink-soft">Tub when full</dt><dd className="num text-xl"><TempValue tempC={r.finalTempC} units={units} withUnit /></dd></div>
      </dl>
      {r.target ? (
        <p className="text-sm">
          For <TempValue tempC={r.target.targetTempC} units={units} withUnit />:{' '}
          {r.target.flowM3PerS ? <><span className="num">{u.flow.from(r.target.flowM3PerS).toFixed(2)} {u.flow.label}</span>, filling in <span className="num">{hm(r.target.fillTimeS!)}</span>. </> : null}
          {r.target.note}
        </p>
      ) : null}
      <p className="text-xs text-ink-muted">{r.heaterNote} Surface losses during the fill are left out (fills take minutes to hours).</p>
      <CautionList cautions={r.cautions} label="Cautions for the tub fill" />
    </div>
  );
}
