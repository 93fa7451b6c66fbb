'use client';

import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnits } from '@/app/_contracts/units';
import type { SeasonView } from '../_contracts/study-blocks';
import { CautionList, TempValue } from './safety-notice';

/** Money to the cent, or to a tenth of a cent below one unit. */
const money = (v: number, c: string) => `${v.toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: Math.abs(v) < 1 ? 3 : 2 })} ${c}`;
const n = (v: number, digits = 1) => v.toLocaleString('en-US', { maximumFractionDigits: digits });
const FUEL_NAMES: Record<string, string> = { 'natural-gas': 'natural gas', propane: 'propane', 'electric-resistance': 'electric resistance', 'heat-pump': 'heat pump', wood: 'wood' };

/** A season held at a target (a cost sheet's or a forecast's): losses, heat, fuel, money and the payback of the build. */
export function SeasonResult({ season: s, units }: { season: SeasonView; units: UnitSystem }) {
  const u = displayUnits(units);
  const p = s.payback;
  const rows: [string, React.ReactNode][] = [
    ['Season', `${s.days} days, heater ${s.hoursPerDay} h a day, cover ${s.cover ? 'on outside the heater hours' : 'off'}`],
    ['Target', <TempValue key="t" tempC={s.targetTempC} units={units} withUnit />],
    ['Mean losses at the target', `${n(u.power.from(s.lossW), 2)} ${u.power.label}${s.solarW > 0 ? `, less ${n(u.power.from(s.solarW), 2)} ${u.power.label} of sun: ${n(u.power.from(s.netLossW), 2)} ${u.power.label}` : ''}`],
    ['Heater hours a day that hold it', s.holdHoursPerDay === null ? 'cannot hold it' : `${s.holdHoursPerDay.toFixed(1)} h`],
    ['Useful heat of the season', `${n(u.energy.from(s.usefulJ))} ${u.energy.label}`],
    ['Fuel or electricity bought', `${n(s.fuelUnits, 2)} ${s.fuelUnit} (${n(s.fuelKWh, 0)} kWh, ${n(s.fuelTherms, 1)} therm)`],
    ['Running cost of the season', money(s.annualCost, s.currency)],
  ];
  if (p) {
    rows.push(
      ['Build cost', `${money(p.buildCost, s.currency)} (${p.buildBasis})`],
      ['Purchased heater', `${money(p.purchasedPrice, s.currency)}, ${FUEL_NAMES[p.purchasedFuel] ?? p.purchasedFuel} at ${p.purchasedFuel === 'heat-pump' ? `COP ${p.purchasedEfficiency}` : `${(p.purchasedEfficiency * 100).toFixed(0)} %`}`],
      ['Its running cost of the season', money(p.annualCostPurchased, s.currency)],
      ['Saving a season with the build', money(p.annualSaving, s.currency)],
    );
  }
  return (
    <section className="space-y-3" aria-label="Season" data-testid="season">
      <h4 className="font-semibold text-ink">A season at the target</h4>
      <div className="relative overflow-x-auto" tabIndex={0}>
        <table className="data-table">
          <tbody>
            {rows.map(([k, v]) => (
              <tr key={k}>
                <th scope="row" className="text-left font-normal">{k}</th>
                <td className="num text-right">{v}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {p ? (
        <p className="card p-3 text-ink" data-testid="payback">
          <strong>Payback:</strong> {p.verdict}
        </p>
      ) : null}
      {s.notes.length ? (
        <ul className="list-disc space-y-1 pl-5 text-sm text-ink-soft">
          {s.notes.map((t) => <li key={t}>{t}</li>)}
        </ul>
      ) : null}
      <CautionList cautions={s.cautions} label="Cautions for the season’s target" />
    </section>
  );
}
