/** The steadiness presets the page offers and their thresholds, each in a display unit. */
import type { PresetName } from '@/analysis/segment/steady-criteria';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

export const PRESET_TEXT: Record<PresetName, { label: string; note: string }> = {
  laboratory: { label: 'Laboratory', note: 'After ASHRAE 93: outlet drifting under 0.05 K/min, inlet within ±1 K, flow within ±2 %, at least 15 min.' },
  collector: { label: 'Solar collector', note: 'After ISO 9806: flow within ±1 %, inlet within ±0.1 K, 30-s means checked against the period, at least 15 min.' },
  field: { label: 'Field (fires and burners)', note: 'Our field preset: outlet drifting under 0.15 K/min, flow varying under 2 %, at least 5 min after 3 loop transit times.' },
};

export type Key = 'windowS' | 'maxOutletSlopeKPerS' | 'inletTolK' | 'flowTolFraction' | 'maxFlowCv' | 'ambientTolK' | 'minDurationS' | 'settlingS' | 'transitTimeS' | 'blockS';

/** The thresholds the page offers, each shown in a display unit (empty = not judged, where allowed). */
export function thresholdRows(u: UnitSystem): { key: Key; label: string; unit: string; toShow: (si: number) => number; toSI: (v: number) => number; nullable: boolean }[] {
  const diff = displayUnits(u).tempDiff;
  const k = diff.from;
  const kInv = diff.to;
  return [
    { key: 'maxOutletSlopeKPerS', label: 'Outlet drift under', unit: `${diff.label}/min`, toShow: (x) => k(x) * 60, toSI: (v) => kInv(v) / 60, nullable: true },
    { key: 'inletTolK', label: 'Inlet within ±', unit: diff.label, toShow: k, toSI: kInv, nullable: true },
    { key: 'flowTolFraction', label: 'Flow within ±', unit: '%', toShow: (x) => x * 100, toSI: (v) => v / 100, nullable: true },
    { key: 'maxFlowCv', label: 'Flow variation (CV) under', unit: '%', toShow: (x) => x * 100, toSI: (v) => v / 100, nullable: true },
    { key: 'ambientTolK', label: 'Ambient within ±', unit: diff.label, toShow: k, toSI: kInv, nullable: true },
    { key: 'windowS', label: 'Judged over windows of', unit: 'min', toShow: (x) => x / 60, toSI: (v) => v * 60, nullable: false },
    { key: 'minDurationS', label: 'Shortest period', unit: 'min', toShow: (x) => x / 60, toSI: (v) => v * 60, nullable: false },
    { key: 'settlingS', label: 'Settling dropped from each start', unit: 'min', toShow: (x) => x / 60, toSI: (v) => v * 60, nullable: false },
    { key: 'transitTimeS', label: 'Loop transit time', unit: 's', toShow: (x) => x, toSI: (v) => v, nullable: true },
    { key: 'blockS', label: 'Block for standard errors', unit: 's', toShow: (x) => x, toSI: (v) => v, nullable: false },
  ];
}
