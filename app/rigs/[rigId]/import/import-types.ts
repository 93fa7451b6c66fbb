/**
 * The shapes of the import page: the mapping the engineer edits and the preview the server
 * answers (POST …/uploads/{file}/preview), and the fields and units a column can take.
 */

export type Field = 'time' | 'bucketVolume' | 'fillTime' | 'flow' | 'inletTemp' | 'outletTemp' | 'ambientTemp' | 'notes';
export interface MappingColumn {
  column: number;
  header: string;
  field: Field;
  unit?: string;
}
export type Shape = 'trialSheet' | 'sensorLog';
export interface Mapping {
  shape: Shape;
  decimal: '.' | ',';
  dateOrder?: 'dmy' | 'mdy';
  columns: MappingColumn[];
}
export interface Issue {
  line: number;
  severity: 'error' | 'warning';
  column?: string;
  message: string;
}
export interface Preview {
  file: { id: string; filename: string; sizeBytes: number; sha256: string; state: string; rowsImported: number };
  kind: 'xlsx' | 'text';
  sheets: { name: string; rowCount: number }[];
  header: string[];
  metadata: { line: number; text: string }[];
  warnings: string[];
  rowCount: number;
  /** only the head of a large file was read */
  partial: boolean;
  shape: { shape: Shape; reason: string; medianIntervalS: number | null };
  alternatives: { trialSheet: Mapping; sensorLog: Mapping | null };
  logHead: { accepted: number; rejected: number; issues: Issue[]; notices: string[]; rows: { line: number; timeS: number; inletTempC: number; outletTempC: number; flowM3PerS: number }[] } | null;
  suggestion: { columns: { column: number; confidence: number; note?: string }[]; missing: string[]; dateOrder: string | null };
  savedMapping: boolean;
  mapping: Mapping;
  mappingError: string | null;
  check: { okCount: number; errorCount: number; warningCount: number; notices: string[]; issues: Issue[]; preview: { line: number; ok: boolean; row?: { flowM3PerS: number; inletTempC: number; outletTempC: number } }[]; hottest?: { inletTempC: number | null; outletTempC: number | null; outletLine: number | null } } | null;
}

export const FIELDS: { id: Field | ''; label: string; units: string[] }[] = [
  { id: '', label: '— ignore —', units: [] },
  { id: 'time', label: 'Time', units: ['datetime', 's', 'min', 'h'] },
  { id: 'bucketVolume', label: 'Bucket volume', units: ['L', 'mL', 'gal', 'm^3', 'ft^3'] },
  { id: 'fillTime', label: 'Fill time', units: ['s', 'min', 'ms'] },
  { id: 'flow', label: 'Flow reading', units: ['L/min', 'L/s', 'L/h', 'gpm', 'gph', 'm^3/h', 'm^3/s', 'mL/s', 'mL/min'] },
  { id: 'inletTemp', label: 'Inlet temperature', units: ['degC', 'degF', 'K'] },
  { id: 'outletTemp', label: 'Outlet temperature', units: ['degC', 'degF', 'K'] },
  { id: 'ambientTemp', label: 'Ambient temperature', units: ['degC', 'degF', 'K'] },
  { id: 'notes', label: 'Notes', units: [] },
];

/** Fields a sensor log maps (time, the two temperatures, flow, optional ambient). */
export const LOG_FIELDS = new Set<Field | ''>(['', 'time', 'flow', 'inletTemp', 'outletTemp', 'ambientTemp']);
/** How the unit menus write the units (the rest as they are). */
export const UNIT_TEXT: Record<string, string> = { degC: '°C', degF: '°F', 'm^3': 'm³', 'ft^3': 'ft³', 'm^3/h': 'm³/h', 'm^3/s': 'm³/s', gal: 'US gal', datetime: 'date/time' };
