/**
 * Header cells → column names: trimmed, trailing empty cells dropped, an empty name inside the
 * header replaced by "column N", and duplicate names refused (a mapping could not tell them apart).
 */
import { ImportError, type SourceLocation } from './import-error';

/** Spreadsheet column letters for a 0-based index: 0 → "A", 27 → "AB". */
export function columnLetter(index: number): string {
  let s = '';
  let n = index + 1;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** Collapses inner whitespace and trims, keeping case and symbols (°, [, ( …). */
export function cleanHeaderCell(cell: unknown): string {
  return String(cell ?? '').replace(/\s+/g, ' ').trim();
}

/**
 * @throws ImportError `no_header` when no name is left, `duplicate_column` naming both positions.
 * @example checkHeader(['time', ' inlet °C ', ''], {}) // ['time', 'inlet °C']
 */
export function checkHeader(cells: unknown[], where: SourceLocation): string[] {
  const names = cells.map(cleanHeaderCell);
  while (names.length > 0 && names[names.length - 1] === '') names.pop();
  if (names.length === 0) throw new ImportError('no_header', 'the header row is empty', where);
  const seen = new Map<string, number>();
  names.forEach((name, i) => {
    if (name === '') names[i] = `column ${columnLetter(i)}`;
  });
  names.forEach((name, i) => {
    const key = name.toLowerCase();
    const first = seen.get(key);
    if (first !== undefined) {
      throw new ImportError(
        'duplicate_column',
        `the column name "${name}" appears twice (columns ${columnLetter(first)} and ${columnLetter(i)}); rename one so each column can be mapped`,
        { ...where, column: name },
      );
    }
    seen.set(key, i);
  });
  return names;
}
