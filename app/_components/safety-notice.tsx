/**
 * Safety on screen, in one place: the standing notice of every page, the mark beside a hot
 * temperature and the caution list beside a table, a plot or a result. Plain components without
 * hooks, so server pages and client leaves share them. The rules and their words come from
 * analysis/safety/cautions.ts (hazardBand, temperatureCautions); nothing here decides what is hot.
 */
import { CAUTION_DEFER, cautionsToShow, hazardBand, hottestCautions, type CautionLike, type HazardBand, type PlaceTemperatures } from '@/analysis/safety/cautions';
import { STANDING_NOTICE } from '@/analysis/safety/standing-notice';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

/** The standing notice shown on every page: Emberline is an analysis aid, not a design approval. */
export function SafetyNotice() {
  return (
    <aside aria-label="Safety notice" className="border-t border-paper-line bg-paper-deep">
      <div className="mx-auto max-w-page space-y-1.5 px-4 py-5 text-sm text-ink-soft">
        {STANDING_NOTICE.map((t, i) => (
          <p key={i}>{i === 0 ? <strong className="text-ink">{t}</strong> : t}</p>
        ))}
      </div>
    </aside>
  );
}

const DANGER = new Set<HazardBand>(['seconds', 'steam']);

function WarningIcon({ className = '' }: { className?: string }) {
  return (
    <svg aria-hidden="true" focusable="false" viewBox="0 0 16 16" className={`inline-block h-3 w-3 shrink-0 ${className}`}>
      <path d="M8 1.5 15 14.5H1Z" fill="currentColor" />
      <path d="M8 6v4.2M8 11.8v.9" stroke="white" strokeWidth="1.6" strokeLinecap="round" />
    </svg>
  );
}

/**
 * A temperature in the reader's units, marked when it is at or above a caution threshold: a
 * warning icon and a one-word badge that are seen, the reason in words for screen readers
 * (visually hidden), and the same words as a tooltip. Below 40 °C it is the plain number.
 * @param tempC the temperature, °C (not finite: a dash)
 */
export function TempValue({ tempC: c, units, digits = 1, withUnit = false }: { tempC: number | null | undefined; units: UnitSystem; digits?: number; withUnit?: boolean }) {
  if (typeof c !== 'number' || !Number.isFinite(c)) return <>—</>;
  const text = `${displayUnits(units).temp.from(c).toFixed(digits)}${withUnit ? ` ${displayUnits(units).temp.label}` : ''}`;
  const h = hazardBand(c, units);
  if (h.band === 'none') return <>{text}</>;
  const tone = DANGER.has(h.band) ? 'bg-danger-bg text-danger-text ring-danger-line' : 'bg-caution-bg text-caution-text ring-caution-line';
  return (
    <span className="inline-flex items-center justify-end gap-1.5 whitespace-nowrap" data-hazard={h.band}>
      <span className={DANGER.has(h.band) ? 'font-semibold text-danger-text' : 'font-semibold text-caution-text'}>{text}</span>
      <span title={h.label} className={`inline-flex items-center gap-0.5 rounded px-1 py-px font-sans text-[0.7rem] font-semibold leading-4 ring-1 ${tone}`}>
        <WarningIcon />
        <span aria-hidden="true">{h.tag}</span>
      </span>
      <span className="sr-only">({h.label})</span>
    </span>
  );
}

/** The sentence shared by every caution, said once under the list instead of after each. */
const strip = (m: string) => m.replace(CAUTION_DEFER, '').trim();

/**
 * The cautions beside a table, plot or result: each distinct caution once, worst first, one per
 * hazard and place (a temperature's highest band only, not the lower bands under it), its level
 * in words (not colour alone), and the analysis-aid sentence once at the end.
 */
export function CautionList({ cautions, label = 'Cautions' }: { cautions: readonly CautionLike[]; label?: string }) {
  const list = cautionsToShow(cautions, { bands: 'highest' });
  if (!list.length) return null;
  const defer = list.some((c) => c.message.includes(CAUTION_DEFER));
  return (
    <div className="space-y-2" data-cautions>
      <ul className="space-y-2" aria-label={label}>
        {list.map((c, i) => (
          <li
            key={`${c.code}|${c.where ?? ''}|${c.thresholdC ?? ''}|${i}`}
            className={`flex gap-2 rounded-lg border px-3 py-2 text-sm ${c.level === 'danger' ? 'border-danger-line bg-danger-bg text-danger-text' : 'border-caution-line bg-caution-bg text-caution-text'}`}
          >
            <WarningIcon className="mt-1" />
            <span>
              <strong className="font-semibold">{c.level === 'danger' ? 'Danger: ' : c.level === 'warning' ? 'Warning: ' : 'Note: '}</strong>
              {strip(c.message)}
            </span>
          </li>
        ))}
      </ul>
      {defer ? <p className="text-xs text-ink-muted">{CAUTION_DEFER}</p> : null}
    </div>
  );
}

/**
 * The caution list for the temperatures a table or plot shows: the hottest value of each place
 * (inlet, outlet, pool…) and one caution per hazard it reaches. Nothing when all are below 40 °C.
 * @example <TemperatureCautions places={[{ where: 'outlet', valuesC: rows.map((r) => r.outletTempC) }]} />
 */
export function TemperatureCautions({ places, units = 'si', label }: { places: readonly PlaceTemperatures[]; units?: UnitSystem; label?: string }) {
  return <CautionList cautions={hottestCautions(places, units)} label={label} />;
}
