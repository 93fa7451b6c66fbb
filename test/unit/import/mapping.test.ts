import { describe, expect, test } from 'vitest';
import { splitHeader, suggestMapping } from '@/app/_lib/imports/auto-map';
import { headerSignature, normaliseHeaderName } from '@/app/_lib/imports/header-signature';
import { checkMapping } from '@/app/_lib/imports/apply-mapping';
import { importErrorOf } from './helpers';

describe('auto-mapping from header names and unit hints', () => {
  test.each([
    ['Outlet (°F)', 'outletTemp', 'degF', 'header'],
    ['T_out [C]', 'outletTemp', 'degC', 'header'],
    ['T_in [C]', 'inletTemp', 'degC', 'header'],
    ['Tout°C', 'outletTemp', 'degC', 'header'],
    ['flow_gpm', 'flow', 'gpm', 'header'],
    ['Durchfluss l/min', 'flow', 'L/min', 'header'],
    ['gpm', 'flow', 'gpm', 'header'],
    ['fill 1 (s)', 'fillTime', 's', 'header'],
    ['Füllzeit 2 (s)', 'fillTime', 's', 'header'],
    ['bucket (gal)', 'bucketVolume', 'gal', 'header'],
    ['Eimer (l)', 'bucketVolume', 'L', 'header'],
    ['Eintritt (°C)', 'inletTemp', 'degC', 'header'],
    ['Austritt (°C)', 'outletTemp', 'degC', 'header'],
    ['Temperatur Eintritt in °C', 'inletTemp', 'degC', 'header'],
    ['ambient', 'ambientTemp', 'degC', 'default'],
    ['Umgebung (°C)', 'ambientTemp', 'degC', 'header'],
    ['time_s', 'time', 's', 'header'],
    ['Zeit', 'time', 's', 'default'],
  ])('%j → %s in %s (unit from the %s)', (header, field, unit, source) => {
    const [c] = suggestMapping([header]).columns;
    expect(c).toMatchObject({ field, unit, unitSource: source });
    expect(c.confidence).toBeGreaterThan(0.5);
  });

  test('notes take no unit', () => {
    expect(suggestMapping(['notes']).columns[0]).toMatchObject({ field: 'notes', unit: null });
    expect(suggestMapping(['Bemerkung']).columns[0].field).toBe('notes');
  });

  test('a header with its unit is more certain than one without', () => {
    const [withUnit, without] = suggestMapping(['inlet (°C)', 'outlet']).columns;
    expect(withUnit.confidence).toBeGreaterThan(without.confidence);
    expect(without.note).toBe('no unit in the header; °C assumed');
  });

  test('a time column holding dates is mapped as date/time from its cells', () => {
    const s = suggestMapping(['Zeit', 'T_in [C]'], [['02.05.2026 10:15', '14,2'], ['02.05.2026 10:40', '14,3']], ',');
    expect(s.columns[0]).toMatchObject({ field: 'time', unit: 'datetime', unitSource: 'cells' });
  });

  test('a unit written in the cells is used when the header has none', () => {
    const s = suggestMapping(['outlet'], [['95 °F'], ['96 °F']]);
    expect(s.columns[0]).toMatchObject({ field: 'outletTemp', unit: 'degF', unitSource: 'cells' });
  });

  test('a unit that does not fit the field lowers the confidence and says so', () => {
    const [c] = suggestMapping(['flow (°C)']).columns;
    expect(c.field).toBe('flow');
    expect(c.confidence).toBeLessThanOrEqual(0.4);
    expect(c.note).toMatch(/does not fit a volumeFlow column/);
  });

  test('a bare temperature is not guessed as inlet or outlet', () => {
    const [c] = suggestMapping(['Water temp (°F)']).columns;
    expect(c.field).toBeNull();
    expect(c.note).toMatch(/does not say inlet, outlet or ambient/);
  });

  test('each field goes to one column (fill times to several); the less certain twin is left unmapped with a note', () => {
    const s = suggestMapping(['time', 'inlet (°C)', 'T_in', 'outlet (°C)', 'fill 1 (s)', 'fill 2 (s)', 'fill 3 (s)', 'bucket (L)']);
    expect(s.columns.map((c) => c.field)).toEqual(['time', 'inletTemp', null, 'outletTemp', 'fillTime', 'fillTime', 'fillTime', 'bucketVolume']);
    expect(s.columns[2].note).toBe('also looks like inletTemp, which column "inlet (°C)" already takes');
    expect(s.missing).toEqual([]);
  });

  test('reports how slashed dates in the time column read, so the page can ask when they are ambiguous', () => {
    expect(suggestMapping(['Time', 'inlet'], [['05/14/2026 9:40 AM', '59'], ['05/02/2026', '60']]).dateOrder).toBe('mdy');
    expect(suggestMapping(['Time', 'inlet'], [['05/02/2026', '59'], ['06/03/2026', '60']]).dateOrder).toBe('ambiguous');
    expect(suggestMapping(['Time', 'inlet'], [['2026-05-02', '59']]).dateOrder).toBeNull();
  });

  test('says what a trial sheet still lacks', () => {
    expect(suggestMapping(['time', 'outlet (°C)', 'bucket (L)']).missing).toEqual(['inlet temperature', 'flow, or bucket volume and at least one fill time']);
  });

  test('splitHeader keeps the name apart from the unit', () => {
    expect(splitHeader('Outlet (°F)')).toEqual({ name: 'Outlet', unitText: '°F', unit: 'degF' });
    expect(splitHeader('flow_gpm')).toEqual({ name: 'flow', unitText: 'gpm', unit: 'gpm' });
    expect(splitHeader('notes')).toEqual({ name: 'notes', unitText: null, unit: null });
  });
});

describe('header signature', () => {
  test('does not change with case, spacing or compatibility forms of a character', () => {
    expect(normaliseHeaderName('  Outlet  (℃) ')).toBe('outlet (°c)');
    expect(headerSignature(['time', 'T_in [C]'])).toBe(headerSignature([' Time ', 't_in  [c]']));
    expect(headerSignature(['time', 'T_in [C]'])).toMatch(/^[0-9a-f]{64}$/);
  });

  test('changes with the order or the set of columns', () => {
    const a = headerSignature(['time', 'inlet', 'outlet']);
    expect(headerSignature(['time', 'outlet', 'inlet'])).not.toBe(a);
    expect(headerSignature(['time', 'inlet'])).not.toBe(a);
    expect(headerSignature(['time,inlet', 'outlet'])).not.toBe(headerSignature(['time', 'inlet,outlet']));
  });
});

describe('a confirmed mapping is checked against the header', () => {
  const header = ['time', 'inlet (°C)', 'outlet (°C)', 'flow (L/min)'];
  const good = {
    shape: 'trialSheet',
    columns: [
      { column: 1, header: 'inlet (°C)', field: 'inletTemp', unit: 'degC' },
      { column: 2, header: 'outlet (°C)', field: 'outletTemp', unit: 'degC' },
      { column: 3, header: 'flow (L/min)', field: 'flow', unit: 'L/min' },
    ],
  };

  test('accepts a complete mapping and fills defaults', () => {
    expect(checkMapping(good, header)).toMatchObject({ decimal: '.', utcOffsetMinutes: 0 });
  });

  test.each([
    ['a missing outlet', { ...good, columns: good.columns.filter((c) => c.field !== 'outletTemp') }, 'missing_column', 'no column is mapped to outlet temperature'],
    ['a sensor log without time', { ...good, shape: 'sensorLog' }, 'missing_column', 'no column is mapped to time'],
    ['a header that changed', { ...good, columns: [{ ...good.columns[0], header: 'T_in' }, ...good.columns.slice(1)] }, 'bad_mapping', 'column B is "inlet (°C)" in this file, not "T_in"; map the columns again'],
    ['a column past the end', { ...good, columns: [...good.columns, { column: 9, header: 'x', field: 'notes' }] }, 'bad_mapping', 'the mapping names column J, but the file has 4 columns'],
    ['a field twice', { ...good, columns: [...good.columns, { column: 0, header: 'time', field: 'inletTemp', unit: 'degC' }] }, 'bad_mapping', 'inletTemp is mapped to both "inlet (°C)" and "time"'],
    ['a unit of the wrong kind', { ...good, columns: [{ ...good.columns[0], unit: 'gpm' }, ...good.columns.slice(1)] }, 'bad_mapping', 'US gpm is not a unit of temperature for inletTemp'],
    ['an unknown unit', { ...good, columns: [{ ...good.columns[0], unit: 'furlong' }, ...good.columns.slice(1)] }, 'bad_mapping', 'the mapping is not valid: columns.0.unit'],
  ])('refuses %s', async (_what, mapping, code, message) => {
    const e = await importErrorOf(() => checkMapping(mapping, header, { file: 't.csv' }));
    expect(e.code).toBe(code);
    expect(e.message).toContain(message);
    expect(e.message.startsWith('t.csv')).toBe(true);
  });
});
