// The cell rules of METHODS.md §1 (the contract itself is the source of these expectations).
import { cellLabel, cellNumber, decimalCommaHint, typedNumber } from '../../src/input/cells';

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
  test('blank-looking cells are missing, whatever the whitespace (issue 9)', () => {
    // NBSP, narrow NBSP, en/em/ideographic spaces, line breaks (a CSV "\n", Excel's Alt+Enter), BOM, zero-width space.
    for (const m of ['\u00a0', '\u202f', '\u2002', '\u2003', '\u3000', '\n', '\r\n', '\r', '\t\n ', '\ufeff', '\u200b', '\u0085', ' \u00a0NA\u00a0']) {
      expect(cellNumber(m)).toBeNull();
      expect(cellLabel(m)).toBeNull();
    }
    expect(cellNumber('\u00a012.5\u2003')).toBe(12.5);
    expect(cellNumber('\n1\n')).toBe(1);
  });
  test('no hexadecimal, binary or octal through leading whitespace of any kind', () => {
    for (const m of ['\u00a00x10', '\u30000x10', '\n0b11', '\u00a00o7', ' 0x10', '\u00a0Infinity']) expect(cellNumber(m)).toBeUndefined();
  });
  test('a decimal comma gets a hint', () => {
    expect(decimalCommaHint('3,5')).toContain('decimal comma');
    expect(decimalCommaHint('3,5')).toContain('(3.5)');
    expect(decimalCommaHint('-1.234,5')).toContain('(-1234.5)');
    expect(decimalCommaHint('abc')).toBe('');
    expect(decimalCommaHint('1,2,3')).toBe('');
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

// typedNumber: a number typed in a field or list (command-line options, task-pane fields, multiples).
test('typedNumber: decimal text by the cell rules; hexadecimal, Infinity, words and blanks are not numbers', () => {
  expect(typedNumber(' 60 ')).toBe(60);
  expect(typedNumber('\u200b-1.5e2\u00a0')).toBe(-150);
  expect(typedNumber('.5')).toBe(0.5);
  for (const t of ['0x10', '0b1', '0o7', 'Infinity', '-Infinity', '1e999', 'TRUE', 'NA', '', '\u200b', '1,5', 'sixty']) expect(typedNumber(t)).toBeUndefined();
});
