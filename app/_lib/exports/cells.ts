/**
 * Cell values of every export, and their neutralising against formula injection.
 *
 * OWASP, "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection): a spreadsheet treats a
 * cell whose text starts with `=`, `+`, `-`, `@`, tab (0x09) or carriage return (0x0D) as a
 * formula; the guidance is to prepend a single quote so it is read as text (and to quote every
 * field, which csv.ts does). We apply it to every string cell of every CSV and XLSX export, the
 * headers too, while numbers, booleans and dates keep their type: a negative number passed as a
 * number stays a number. A *string* "-3.5" is neutralised like any other text, so pass numbers
 * as numbers.
 *
 * Written here rather than taken from papaparse's `escapeFormulae`: its pattern
 * `/^[=+\-@\t\r].*$/` has no `s` flag, so a multi-line text such as "=1+2\nnote" slips through,
 * and exceljs has no such option at all.
 */

/** What an export cell may hold; null and undefined give an empty cell. */
export type CellValue = string | number | boolean | Date | null | undefined;

/** A cell after neutralising: the same types, with null for empty. */
export type SafeCell = string | number | boolean | Date | null;

/** First characters that make a spreadsheet read a cell as a formula (OWASP "CSV Injection"). */
export const FORMULA_TRIGGERS: readonly string[] = ['=', '+', '-', '@', '\t', '\r'];

/**
 * Prefixes a single quote when `text` starts with a formula trigger.
 * @example neutraliseText('=HYPERLINK("x")') // "'=HYPERLINK(\"x\")"
 * @example neutraliseText('coil A') // 'coil A'
 */
export function neutraliseText(text: string): string {
  return text.length > 0 && FORMULA_TRIGGERS.includes(text[0]) ? `'${text}` : text;
}

/**
 * Neutralises one cell: strings through {@link neutraliseText}; finite numbers, booleans and valid
 * dates unchanged; null/undefined → null.
 * @param where where the cell is (sheet, column, row), for the error message
 * @throws TypeError for NaN, ±Infinity or an invalid Date (STYLE.md §10: NaN never escapes
 *   silently), and for any other type (objects, functions…).
 * @example neutraliseCell(-3.5) // -3.5
 * @example neutraliseCell('-3.5') // "'-3.5"
 */
export function neutraliseCell(value: CellValue, where = 'cell'): SafeCell {
  if (value === null || value === undefined) return null;
  if (typeof value === 'string') return neutraliseText(value);
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new TypeError(`${where} must be a finite number, got ${value}`);
    return value;
  }
  if (typeof value === 'boolean') return value;
  if (value instanceof Date) {
    if (Number.isNaN(value.getTime())) throw new TypeError(`${where} is an invalid date`);
    return value;
  }
  throw new TypeError(`${where} must be a string, number, boolean, Date or null, got ${typeof value}`);
}
