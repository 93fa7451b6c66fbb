import { NumberField } from './forecast-fields';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnit } from '@/app/_contracts/units';

/** The pool or tub: its shape and size, in the reader's length unit. */
export function PoolFieldset({ units, shape, onShape }: { units: UnitSystem; shape: string; onShape: (shape: string) => void }) {
  const us = units === 'us';
  const length = displayUnit('length', units);
  return (
    <fieldset className="card space-y-3 p-4">
      <legend className="px-1 font-semibold">Pool or tub</legend>
      <label className="block">
        <span className="field-label">Shape</span>
        <select className="field-input" value={shape} onChange={(e) => onShape(e.target.value)}>
          <option value="round">Round</option>
          <option value="rectangle">Rectangle</option>
          <option value="ellipse">Oval (ellipse)</option>
          <option value="stadium">Stadium</option>
        </select>
      </label>
      {shape === 'round' ? <NumberField name="diameter" label="Diameter" def={us ? '18' : '5.5'} unit={length.label} /> : (
        <div className="grid grid-cols-2 gap-3">
          <NumberField name="length" label="Length" def={us ? '32' : '10'} unit={length.label} />
          <NumberField name="width" label="Width" def={us ? '16' : '5'} unit={length.label} />
        </div>
      )}
      <NumberField name="depth" label="Water depth" def={us ? '4' : '1.2'} unit={length.label} />
    </fieldset>
  );
}
