/** Which blocks fetch their data again after an autosave (issue 7: only the changed ones). Common practice. */
import { describe, expect, test } from 'vitest';
import { changedBlocks } from '../../../app/studies/[studyId]/study-blocks-model';

type B = Parameters<typeof changedBlocks>[0][number];
const text: B = { id: 't', kind: 'text', data: { markdown: 'a' } };
const fc: B = { id: 'f', kind: 'forecast', data: { poolVolume: '57 m^3', startTemp: '20 degC', targetTemp: '28 degC' } };
const cost: B = { id: 'c', kind: 'costs', data: { fuel: 'propane', price: 3, heatFrom: 'forecast', forecastBlockId: 'f' } };
const log: B = { id: 'l', kind: 'sensor-log', data: { sourceFileId: '00000000-0000-4000-8000-000000000000' } };

describe('changedBlocks', () => {
  test('an edited block changes, the others do not', () => {
    expect(changedBlocks([text, fc, log], [{ ...text, data: { markdown: 'b' } }, fc, log])).toEqual(['t']);
  });
  test('moving or deleting blocks changes none; a new block does', () => {
    expect(changedBlocks([text, fc, log], [log, text])).toEqual([]);
    expect(changedBlocks([text], [text, log])).toEqual(['l']);
  });
  test('a cost sheet that takes its heat from an edited forecast changes with it', () => {
    const hotter = { ...fc, data: { ...fc.data, targetTemp: '30 degC' } };
    expect(changedBlocks([fc, cost, text], [hotter, cost, text]).sort()).toEqual(['c', 'f']);
    expect(changedBlocks([fc, cost], [fc, { ...cost, data: { ...cost.data, price: 3.2 } }])).toEqual(['c']);
  });
  test('a block whose kind changes under the same id changes', () => {
    expect(changedBlocks([text], [{ ...text, kind: 'caution' }])).toEqual(['t']);
  });
});
