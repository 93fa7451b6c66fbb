/**
 * The one error type of the import core. Every refusal (an empty file, a binary file named .csv,
 * a zip bomb, a missing column …) is an ImportError with a stable `code` and a `where` that says
 * file, sheet, line and column as far as they are known. Route handlers map it to a 422 (or 413
 * for `too_large`); nothing here knows about HTTP.
 */
import { DomainError } from '../server/errors';

/** Where in the source a problem was found; 1-based line and column numbers. */
export interface SourceLocation {
  file?: string;
  sheet?: string;
  /** 1-based line of the text file, or 1-based row of the sheet */
  line?: number;
  /** the column's header text, or its letter in a sheet */
  column?: string;
  /** a spreadsheet cell reference such as "C7" */
  cell?: string;
}

export type ImportErrorCode =
  | 'empty_file'
  | 'binary_file'
  | 'invalid_encoding'
  | 'too_large'
  | 'zip_bomb'
  | 'not_xlsx'
  | 'no_such_sheet'
  | 'no_header'
  | 'duplicate_column'
  | 'missing_column'
  | 'bad_mapping'
  | 'bad_criteria'
  | 'bad_period'
  | 'unreadable';

/** Renders a location as "file.csv, sheet "Log", line 12, column "Outlet (°F)"". */
export function describeLocation(where: SourceLocation): string {
  const parts: string[] = [];
  if (where.file) parts.push(where.file);
  if (where.sheet) parts.push(`sheet "${where.sheet}"`);
  if (where.cell) parts.push(`cell ${where.cell}`);
  else if (where.line !== undefined) parts.push(`line ${where.line}`);
  if (where.column) parts.push(`column "${where.column}"`);
  return parts.join(', ');
}

/** A refusal of the whole file (or the whole mapping), with what and where: invalid input of the one error model (422). */
export class ImportError extends DomainError {
  declare readonly code: ImportErrorCode;
  readonly where: SourceLocation;
  /** the message without the location prefix, for UIs that show the location separately */
  readonly reason: string;

  constructor(code: ImportErrorCode, reason: string, where: SourceLocation = {}) {
    const at = describeLocation(where);
    super('invalid', code, at ? `${at}: ${reason}` : reason);
    this.name = 'ImportError';
    this.where = where;
    this.reason = reason;
  }
}
