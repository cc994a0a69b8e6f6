/**
 * Reading a formula's references (src/report/formulaRefs.ts), and a
 * formula's top-level arguments (splitArgs in src/report/sheetPlan.ts), on
 * formulas of the kinds the summary sheet writes. Expected boxes worked out by
 * hand from the A1 notation (column A = 0, rows 1-based).
 */
import { boxOf, formulaRefs, inside, overlaps } from '../../src/report/formulaRefs';
import { splitArgs } from '../../src/report/sheetPlan';

describe('formulaRefs', () => {
  test('ranges on another sheet, cells on this one, absolute or not', () => {
    expect(formulaRefs('=CUTLINE.TAKEUP(Data!$C$2:$C$6001, Data!D2:D6001, $B$6, B7)', 'S')).toEqual([
      { sheet: 'Data', top: 2, bottom: 6001, left: 2, right: 2 },
      { sheet: 'Data', top: 2, bottom: 6001, left: 3, right: 3 },
      { sheet: 'S', top: 6, bottom: 6, left: 1, right: 1 },
      { sheet: 'S', top: 7, bottom: 7, left: 1, right: 1 },
    ]);
  });

  test("quoted sheet names (with spaces and doubled quotes), two-letter columns", () => {
    expect(formulaRefs("=SUM('Cutline summary'!AA10:AB12)+'O''Brien data'!C3", 'S')).toEqual([
      { sheet: 'Cutline summary', top: 10, bottom: 12, left: 26, right: 27 },
      { sheet: "O'Brien data", top: 3, bottom: 3, left: 2, right: 2 },
    ]);
  });

  test('text in quotes, function names with digits and named cells are not references', () => {
    expect(formulaRefs('=VLOOKUP("B2 standard error", LOG10(A1), 2, FALSE) & cutline_cutoff', 'S')).toEqual([{ sheet: 'S', top: 1, bottom: 1, left: 0, right: 0 }]);
    expect(formulaRefs('=IF(B34<=0.05,"contradicted","not contradicted")', 'S')).toEqual([{ sheet: 'S', top: 34, bottom: 34, left: 1, right: 1 }]);
  });

  test('inside and overlaps', () => {
    const block = boxOf('A9:B19', 'S');
    expect(inside(boxOf('$A$9:$B$18', 'S'), block)).toBe(true);
    expect(inside(boxOf('A9:B20', 'S'), block)).toBe(false);
    expect(inside(boxOf('A9:B18', 'T'), block)).toBe(false);
    expect(overlaps(boxOf('B19:C25', 'S'), block)).toBe(true);
    expect(overlaps(boxOf('C9:C19', 'S'), block)).toBe(false);
  });
});

describe('splitArgs', () => {
  test('top-level arguments only, commas inside calls and quotes kept', () => {
    expect(splitArgs('CUTLINE.COMPLIERCDF(Data!$C$2:$C$6001, Data!$D$2:$D$6001, Data!$E$2:$E$6001, $B$6, A1:A30, 1, MAX(B1, B2), "a, b")')).toEqual([
      'Data!$C$2:$C$6001',
      'Data!$D$2:$D$6001',
      'Data!$E$2:$E$6001',
      '$B$6',
      'A1:A30',
      '1',
      'MAX(B1, B2)',
      '"a, b"',
    ]);
  });
});
