// The cell rules of METHODS.md §1 (the contract itself is the source of these expectations).
import { cellLabel, cellNumber } from '../../src/input/cells';

describe('cellNumber', () => {
  test('numbers, booleans and numeric text', () => {
    expect(cellNumber(3.5)).toBe(3.5);
    expect(cellNumber(' 12 ')).toBe(12);
    expect(cellNumber('-1.5e3')).toBe(-1500);
    expect(cellNumber(true)).toBe(1);
    expect(cellNumber('FALSE')).toBe(0);
    expect(cellNumber('true')).toBe(1);
  });
  test('missing markers', () => {
    for (const m of ['', '   ', 'NA', 'n/a', '#N/A', '.', null, undefined]) expect(cellNumber(m)).toBeNull();
  });
  test('not numbers', () => {
    for (const m of ['abc', '1,5', '0x1A', '0b11', 'Infinity', '-Infinity', '1e999', 'NaN', Infinity, NaN]) {
      expect(cellNumber(m)).toBeUndefined();
    }
  });
});

describe('cellLabel', () => {
  test('labels trim and treat markers as missing', () => {
    expect(cellLabel(' N01 ')).toBe('N01');
    expect(cellLabel(7)).toBe('7');
    expect(cellLabel('NA')).toBeNull();
    expect(cellLabel('')).toBeNull();
  });
});
