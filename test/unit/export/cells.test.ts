import { describe, expect, test } from 'vitest';
import { FORMULA_TRIGGERS, neutraliseCell, neutraliseText } from '../../../app/_lib/exports/cells';

// OWASP, "CSV Injection": cells beginning with = + - @ tab or carriage return are read as formulas;
// prepend a single quote so the spreadsheet reads them as text.
describe('neutraliseText', () => {
  test.each([
    ['=1+2', "'=1+2"],
    ['+1+2', "'+1+2"],
    ['-2+3+cmd|\' /C calc\'!A0', "'-2+3+cmd|' /C calc'!A0"],
    ['@SUM(A1:A2)', "'@SUM(A1:A2)"],
    ['\t=1', "'\t=1"],
    ['\r=1', "'\r=1"],
    ['=HYPERLINK("http://127.0.0.1/x","click")', '\'=HYPERLINK("http://127.0.0.1/x","click")'],
    // a multi-line cell is caught too (papaparse's own pattern misses it; see cells.ts)
    ['=1+2\nsecond line', "'=1+2\nsecond line"],
    ['-3.5', "'-3.5"],
  ])('prefixes a quote to %j (OWASP CSV Injection)', (text, expected) => {
    expect(neutraliseText(text)).toBe(expected);
  });

  test.each(['coil A', '12 L/min', 'a=b', '', ' =1', "'=already text", 'wind 3 m/s, sun'])(
    'leaves %j alone: it does not start with a trigger (OWASP CSV Injection)',
    (text) => { expect(neutraliseText(text)).toBe(text); },
  );

  test('lists exactly the six OWASP trigger characters', () => {
    expect([...FORMULA_TRIGGERS].sort()).toEqual(['\t', '\r', '+', '-', '=', '@'].sort());
  });
});

describe('neutraliseCell', () => {
  // OWASP guidance concerns text; numbers stored as numbers are not formulas (common practice).
  test.each([-3.5, 0, 42, -1e-9, 1e300])('keeps the number %d a number', (n) => {
    expect(neutraliseCell(n)).toBe(n);
  });

  test('keeps booleans and dates, and empties null and undefined (our policy)', () => {
    const d = new Date('2026-07-01T12:00:00Z');
    expect(neutraliseCell(true)).toBe(true);
    expect(neutraliseCell(d)).toBe(d);
    expect(neutraliseCell(null)).toBeNull();
    expect(neutraliseCell(undefined)).toBeNull();
  });

  // STYLE.md §10: NaN never escapes silently.
  test.each([[Number.NaN, /finite/], [Infinity, /finite/], [new Date('nope'), /invalid date/], [{} as unknown as string, /got object/]])(
    'refuses %s, naming where it is', (v, message) => {
      expect(() => neutraliseCell(v, 'Trials: row 3, column flow')).toThrow(TypeError);
      expect(() => neutraliseCell(v, 'Trials: row 3, column flow')).toThrow(message);
    },
  );
});
