/**
 * Columns of physical quantities: the header carries the display unit of the chosen unit system,
 * and each quantity has a number format of sensible precision for it (display only: cells hold
 * the full-precision converted value).
 */
import type { ExportColumn } from './columns';
import { displayUnit, type DisplayQuantity } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

const FORMATS: Record<DisplayQuantity, [si: string, us: string]> = {
  volumeFlow: ['0.00', '0.00'],
  massFlow: ['0.0000', '0.00'],
  temperature: ['0.00', '0.00'],
  temperatureDifference: ['0.00', '0.00'],
  power: ['0.000', '#,##0'],
  conductance: ['0.0', '0.0'],
  volume: ['0.00', '0.00'],
  poolVolume: ['0.00', '0'],
  mass: ['0.00', '0.00'],
  energy: ['0.00', '0.000'],
  irradiance: ['0', '0.0'],
  speed: ['0.0', '0.0'],
  length: ['0.000', '0.00'],
  area: ['0.00', '0.0'],
  time: ['0.0', '0.0'],
};

/**
 * A column of `quantity` in `system`: unit label in the header, a number format for it.
 * @example quantityColumn('flow', 'Flow', 'volumeFlow', 'us') // { unit: 'gpm', numFmt: '0.00', … }
 */
export function quantityColumn(key: string, header: string, quantity: DisplayQuantity, system: UnitSystem, numFmt?: string): ExportColumn {
  return { key, header, unit: displayUnit(quantity, system).label, numFmt: numFmt ?? FORMATS[quantity][system === 'us' ? 1 : 0] };
}

/** Number formats of dimensionless columns. */
export const FMT = {
  ratio: '0.000',
  count: '0',
  stat: '0.0000',
  pValue: '0.0000',
  scientific: '0.000E+00',
  money: '#,##0.00',
  hours: '0.00',
} as const;
