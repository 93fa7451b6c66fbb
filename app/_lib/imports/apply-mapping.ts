/**
 * A confirmed column mapping, checked against the header, and its application to rows: every
 * cell → SI through the column's unit (or the unit written in the cell, e.g. `54 °F`). Cells that
 * carry a unit different from the column's are converted by their own unit and counted, so a
 * column of mixed units is reported once, with the lines of each unit.
 */
import { z } from 'zod';
import {
  FIELD_KIND, TRIAL_FIELDS, UNITS_BY_KIND, UNIT_LABEL, readUnit, toSI, unitFitsField,
  type ColumnUnit, type TrialField,
} from './column-units';
import { columnLetter } from './check-header';
import { ImportError, type SourceLocation } from './import-error';
import { readDate, readSerialDate, type DateOrder, type DateReading } from './read-date';
import { readNumber, readNumberWithUnit } from './read-number';
import type { RowIssue, TrialTime } from '../rigs/trial-rule';

const allUnits = Object.values(UNITS_BY_KIND).flat() as [ColumnUnit, ...ColumnUnit[]];

/** The mapping as the page sends it back after the engineer confirmed it. */
export const confirmedMappingSchema = z.object({
  shape: z.enum(['trialSheet', 'sensorLog']),
  columns: z
    .array(z.object({
      column: z.int().min(0),
      header: z.string(),
      field: z.enum(TRIAL_FIELDS as [TrialField, ...TrialField[]]),
      /** absent for notes; for numbers it may be absent only when every cell states its unit */
      unit: z.enum(allUnits).optional(),
    }))
    .min(1),
  decimal: z.enum(['.', ',']).default('.'),
  /** how slashed dates are read; required when the time column holds ambiguous ones */
  dateOrder: z.enum(['dmy', 'mdy']).optional(),
  /** the lab's zone for zone-less times, minutes east of UTC */
  utcOffsetMinutes: z.int().min(-720).max(840).default(0),
});
export type ConfirmedMapping = z.infer<typeof confirmedMappingSchema>;
export type ConfirmedMappingInput = z.input<typeof confirmedMappingSchema>;

/** A cell as a reader gives it: text from CSV, text or number from XLSX (dates as ISO text), or empty. */
export type CellValue = string | number | null;

/** Schema field of each mapped field. */
export const ROW_FIELD: Record<Exclude<TrialField, 'fillTime' | 'time' | 'notes'>, string> = {
  bucketVolume: 'bucketVolumeM3',
  flow: 'flowM3PerS',
  inletTemp: 'inletTempC',
  outletTemp: 'outletTempC',
  ambientTemp: 'ambientTempC',
  irradiance: 'irradianceWPerM2',
  wind: 'windMPerS',
};

/**
 * Parses and checks a mapping against the header it was made for.
 * @throws ImportError `bad_mapping` (unknown column, header changed, unit of the wrong kind, a field
 *   twice) or `missing_column` (a required field is not mapped), naming the column.
 */
export function checkMapping(input: unknown, header: readonly string[], where: SourceLocation = {}): ConfirmedMapping {
  const parsed = confirmedMappingSchema.safeParse(input);
  if (!parsed.success) {
    const i = parsed.error.issues[0];
    throw new ImportError('bad_mapping', `the mapping is not valid: ${i.path.join('.')} ${i.message}`, where);
  }
  const m = parsed.data;
  const seen = new Map<TrialField, string>();
  const usedColumns = new Set<number>();
  for (const c of m.columns) {
    if (c.column >= header.length) throw new ImportError('bad_mapping', `the mapping names column ${columnLetter(c.column)}, but the file has ${header.length} columns`, where);
    if (header[c.column] !== c.header) {
      throw new ImportError('bad_mapping', `column ${columnLetter(c.column)} is "${header[c.column]}" in this file, not "${c.header}"; map the columns again`, { ...where, column: header[c.column] });
    }
    if (usedColumns.has(c.column)) throw new ImportError('bad_mapping', `column "${c.header}" is mapped twice`, { ...where, column: c.header });
    usedColumns.add(c.column);
    if (c.field !== 'fillTime') {
      const prev = seen.get(c.field);
      if (prev !== undefined) throw new ImportError('bad_mapping', `${c.field} is mapped to both "${prev}" and "${c.header}"`, { ...where, column: c.header });
      seen.set(c.field, c.header);
    }
    if (c.unit && c.field === 'notes') throw new ImportError('bad_mapping', `notes take no unit`, { ...where, column: c.header });
    if (c.unit && !unitFitsField(c.unit, c.field)) {
      throw new ImportError('bad_mapping', `${UNIT_LABEL[c.unit]} is not a unit of ${FIELD_KIND[c.field]} for ${c.field}`, { ...where, column: c.header });
    }
  }
  const fields = [...seen.keys(), ...(m.columns.some((c) => c.field === 'fillTime') ? ['fillTime' as const] : [])];
  const missing: string[] = [];
  if (!fields.includes('inletTemp')) missing.push('inlet temperature');
  if (!fields.includes('outletTemp')) missing.push('outlet temperature');
  if (m.shape === 'trialSheet') {
    if (!fields.includes('flow') && !(fields.includes('bucketVolume') && fields.includes('fillTime'))) missing.push('flow, or bucket volume and at least one fill time');
  } else {
    if (!fields.includes('time')) missing.push('time');
    if (!fields.includes('flow')) missing.push('flow');
  }
  if (missing.length) throw new ImportError('missing_column', `no column is mapped to ${missing.join(', ')}`, where);
  return m;
}

/** Per column: which units its cells were read in, with the first lines of each. */
export interface ColumnUnitReport {
  column: string;
  units: { unit: ColumnUnit; label: string; count: number; firstLines: number[] }[];
}

interface ColumnPlan {
  index: number;
  header: string;
  field: TrialField;
  unit: ColumnUnit | undefined;
  affine: { scale: number; offset: number } | null;
  seen: Map<ColumnUnit, { count: number; firstLines: number[] }>;
}

/** The row in SI before the schema checks it (fields absent when the cell was empty). */
export interface MappedTrialRow {
  time?: TrialTime;
  bucketVolumeM3?: number;
  fillTimesS?: number[];
  flowM3PerS?: number;
  inletTempC?: number;
  outletTempC?: number;
  ambientTempC?: number;
  irradianceWPerM2?: number;
  windMPerS?: number;
  notes?: string;
}

export interface RowMapper {
  /** field of the row schema → source header, for messages */
  columnOf: Record<string, string>;
  /**
   * Converts one row. `issues` holds the cells that could not be read (errors); the row then
   * lacks those fields and the schema will say what is missing.
   */
  map(cells: readonly CellValue[], line: number): { row: MappedTrialRow; issues: RowIssue[] };
  /** Columns whose cells came in more than one unit (call after the last row). */
  mixedUnits(): ColumnUnitReport[];
  /**
   * Records a row whose number cells were all read bare, in their column's unit, exactly as `map`
   * records them (for the fast path of sensor logs, which reads such rows itself).
   */
  noteBareRow(line: number): void;
}

/**
 * Builds the converter for a checked mapping.
 * @param headerLength number of named columns (a value beyond them is an error)
 * @example const m = createRowMapper(mapping, header.length); m.map(['10:00', '12,5'], 5)
 */
export function createRowMapper(mapping: ConfirmedMapping, headerLength: number): RowMapper {
  const plans: ColumnPlan[] = mapping.columns.map((c) => ({
    index: c.column,
    header: c.header,
    field: c.field,
    unit: c.unit,
    affine: c.unit && c.unit !== 'datetime' ? toSI(c.unit) : null,
    seen: new Map(),
  }));
  const fillPlans = plans.filter((p) => p.field === 'fillTime');
  const columnOf: Record<string, string> = {};
  for (const p of plans) {
    const f = p.field === 'fillTime' ? 'fillTimesS' : p.field === 'time' ? 'time' : p.field === 'notes' ? 'notes' : ROW_FIELD[p.field];
    columnOf[f] ??= p.header;
  }
  const dateOpt = { order: mapping.dateOrder as DateOrder | undefined, utcOffsetMinutes: mapping.utcOffsetMinutes };
  const decimal = mapping.decimal;

  const note = (p: ColumnPlan, unit: ColumnUnit, line: number) => {
    let s = p.seen.get(unit);
    if (!s) { s = { count: 0, firstLines: [] }; p.seen.set(unit, s); }
    s.count++;
    if (s.firstLines.length < 5) s.firstLines.push(line);
  };
  const quantityPlans = plans.filter((p) => p.field !== 'time' && p.field !== 'notes');
  /** each quantity column's record of cells in its own unit, once `note` has made it */
  let bare: { count: number; firstLines: number[] }[] | null = null;

  /** number in SI, or an error message */
  const readQuantity = (p: ColumnPlan, cell: string | number, line: number): number | string => {
    if (typeof cell === 'number') {
      if (!p.affine) return `no unit for "${p.header}": choose one in the mapping`;
      note(p, p.unit!, line);
      return cell * p.affine.scale + p.affine.offset;
    }
    const bare = readNumber(cell, decimal);
    if (!Number.isNaN(bare)) {
      if (!p.affine) return `"${cell}" has no unit and the column has none: choose one in the mapping`;
      note(p, p.unit!, line);
      return bare * p.affine.scale + p.affine.offset;
    }
    const withUnit = readNumberWithUnit(cell, decimal);
    if (Number.isNaN(withUnit.value)) return `"${cell}" is not a number`;
    const u = withUnit.unit ? readUnit(withUnit.unit) : null;
    if (!u) return `"${cell}": the unit "${withUnit.unit}" is not one the importer reads`;
    if (!unitFitsField(u, p.field) || u === 'datetime') return `"${cell}" is not a ${FIELD_KIND[p.field]}`;
    note(p, u, line);
    const a = toSI(u);
    return withUnit.value * a.scale + a.offset;
  };

  const readTime = (p: ColumnPlan, cell: string | number): TrialTime | string => {
    if (p.unit && p.unit !== 'datetime') {
      const v = typeof cell === 'number' ? cell : readNumber(cell, decimal);
      if (Number.isNaN(v)) return `"${cell}" is not a number of ${UNIT_LABEL[p.unit]}; map the column as date/time if it holds dates`;
      return { kind: 'elapsed', seconds: v * p.affine!.scale };
    }
    const r: DateReading = typeof cell === 'number' ? readSerialDate(cell, dateOpt) : readDate(cell, dateOpt);
    if (!r.ok) return r.reason;
    return { kind: r.kind, iso: r.iso, epochS: r.epochS };
  };

  return {
    columnOf,
    map(cells, line) {
      const row: MappedTrialRow = {};
      const issues: RowIssue[] = [];
      for (let c = headerLength; c < cells.length; c++) {
        const v = cells[c];
        if (v !== null && String(v).trim() !== '') {
          issues.push({ line, severity: 'error', code: 'extra_cell', column: columnLetter(c), message: `a value ("${String(v).slice(0, 40)}") in column ${columnLetter(c)}, which has no header` });
          break;
        }
      }
      for (const p of plans) {
        const raw = cells[p.index];
        if (raw === null || raw === undefined) continue;
        if (typeof raw === 'string' && raw.trim() === '') continue;
        switch (p.field) {
          case 'notes': row.notes = String(raw).trim(); break;
          case 'time': {
            const t = readTime(p, raw);
            if (typeof t === 'string') issues.push(cellError(line, p, t, 'time')); else row.time = t;
            break;
          }
          case 'fillTime': break;
          default: {
            const v = readQuantity(p, raw, line);
            const f = ROW_FIELD[p.field] as keyof MappedTrialRow;
            if (typeof v === 'string') issues.push(cellError(line, p, v, f));
            else (row as Record<string, unknown>)[f] = v;
          }
        }
      }
      if (fillPlans.length) {
        const fills: number[] = [];
        for (const p of fillPlans) {
          const raw = cells[p.index];
          if (raw === null || raw === undefined || (typeof raw === 'string' && raw.trim() === '')) continue;
          const v = readQuantity(p, raw, line);
          if (typeof v === 'string') issues.push(cellError(line, p, v, 'fillTimesS')); else fills.push(v);
        }
        if (fills.length) row.fillTimesS = fills;
      }
      return { row, issues };
    },
    noteBareRow(line) {
      if (bare === null) {
        for (const p of quantityPlans) note(p, p.unit!, line);
        bare = quantityPlans.map((p) => p.seen.get(p.unit!)!);
        return;
      }
      for (let i = 0; i < bare.length; i++) {
        const s = bare[i];
        s.count++;
        if (s.firstLines.length < 5) s.firstLines.push(line);
      }
    },
    mixedUnits() {
      const out: ColumnUnitReport[] = [];
      for (const p of plans) {
        if (p.seen.size < 2) continue;
        out.push({
          column: p.header,
          units: [...p.seen].map(([unit, s]) => ({ unit, label: UNIT_LABEL[unit], count: s.count, firstLines: s.firstLines })),
        });
      }
      return out;
    },
  };
}

function cellError(line: number, p: ColumnPlan, message: string, field?: string): RowIssue {
  return { line, severity: 'error', code: 'unreadable_cell', field, column: p.header, message };
}

/** A sentence for a mixed-unit column: `column "Outlet": 6 cells in °C (lines 5, 6, …), 2 in °F (lines 11, 12); each was converted by its own unit`. */
export function describeMixedUnits(r: ColumnUnitReport): string {
  const parts = r.units.map((u) => `${u.count} cell${u.count === 1 ? '' : 's'} in ${u.label} (line${u.firstLines.length === 1 ? '' : 's'} ${u.firstLines.join(', ')}${u.count > u.firstLines.length ? ', …' : ''})`);
  return `column "${r.column}" mixes units: ${parts.join(', ')}; each cell was converted by its own unit — check that the column is one quantity`;
}
