import type { CellValue } from './cells';

/** One column of an exported table (CSV or XLSX sheet). */
export interface ExportColumn {
  /** property of each row object that holds the value */
  key: string;
  /** header for people, e.g. "Outlet temperature"; XLSX shows "Outlet temperature (°C)" */
  header: string;
  /** display unit as people write it ("L/min", "°C", "W/K", "Btu/h"); goes into both headers */
  unit?: string;
  /** CSV header base name (default: `key` in snake_case); the unit token is appended */
  csvName?: string;
  /** Excel number format, e.g. "0.00", "0.000E+00", "yyyy-mm-dd hh:mm:ss" */
  numFmt?: string;
  /** XLSX column width in characters (default: from the content) */
  width?: number;
}

/** A row: values by column key. */
export type ExportRow = Record<string, CellValue>;

/**
 * A unit as a header-safe token: "L/min" → "L_per_min", "°C" → "degC", "W/(m²·K)" → "W_per_m2_K",
 * "m³/s" → "m3_per_s", "%" → "pct".
 * @example unitToken('Btu/(h·°F)') // 'Btu_per_h_degF'
 */
export function unitToken(unit: string): string {
  return unit
    .replace(/°\s*C/g, 'degC').replace(/°\s*F/g, 'degF').replace(/°/g, 'deg')
    .replace(/%/g, 'pct').replace(/²/g, '2').replace(/³/g, '3').replace(/\^/g, '')
    .replace(/\s*\/\s*/g, '_per_')
    .replace(/[()]/g, '_').replace(/[·*\s]+/g, '_')
    .replace(/[^A-Za-z0-9_]/g, '')
    .replace(/_+/g, '_').replace(/^_|_$/g, '');
}

/**
 * Snake-case header base: "outletTempC" → "outlet_temp_c", "Fill 1" → "fill_1".
 * @example snakeName('flowRate') // 'flow_rate'
 */
export function snakeName(name: string): string {
  return name
    .replace(/([a-z0-9])([A-Z])/g, '$1_$2')
    .replace(/[^A-Za-z0-9]+/g, '_')
    .replace(/^_|_$/g, '')
    .toLowerCase();
}

/**
 * The CSV header of a column: base name and unit token, e.g. `flow_L_per_min`, `outlet_degC`.
 * @example csvHeader({ key: 'flow', header: 'Flow', unit: 'L/min' }) // 'flow_L_per_min'
 */
export function csvHeader(c: ExportColumn): string {
  const base = c.csvName ?? snakeName(c.key);
  return c.unit ? `${base}_${unitToken(c.unit)}` : base;
}

/**
 * The XLSX header of a column: "Flow (L/min)".
 * @example xlsxHeader({ key: 'flow', header: 'Flow', unit: 'L/min' }) // 'Flow (L/min)'
 */
export function xlsxHeader(c: ExportColumn): string {
  return c.unit ? `${c.header} (${c.unit})` : c.header;
}
