/** The inputs of the forecast form: a number with its unit, and an hour of the day. */

const HOURS = Array.from({ length: 24 }, (_, h) => h);
const hh = (h: number) => `${String(h).padStart(2, '0')}:00`;

/** A decimal input named `name`, labelled with its unit. */
export function NumberField({ name, label, def, unit }: { name: string; label: string; def: string; unit: string }) {
  return (
    <label className="block">
      <span className="field-label">
        {label} <span className="text-xs text-ink-muted">({unit})</span>
      </span>
      <input name={name} defaultValue={def} inputMode="decimal" className="field-input num" />
    </label>
  );
}

/** An hour of the day, 00:00 to 23:00; `fullName` is its accessible name. */
export function HourSelect({ name, label, def, fullName }: { name: string; label: string; def: number; fullName: string }) {
  return (
    <label className="block">
      <span className="field-label">{label}</span>
      <select name={name} defaultValue={def} aria-label={fullName} className="field-input num">
        {HOURS.map((h) => (
          <option key={h} value={h}>
            {hh(h)}
          </option>
        ))}
      </select>
    </label>
  );
}
