// Column checks of src/input/columns.ts (issue 9); expectations from README "Input".
import { numericColumn } from '../../src/input/columns';
import { tableFromRows } from '../../src/input/table';

describe('numericColumn', () => {
  test('blank-looking cells are missing, not 0', () => {
    const t = tableFromRows([['score', 'treated'], [1, '\u00a0'], [2, '\n'], [3, 1]]);
    const c = numericColumn(t, 'treated', 'treated');
    expect(Array.from(c.missing)).toEqual([1, 1, 0]);
  });
  test('a required column missing on every row is named', () => {
    const t = tableFromRows([['score', 'y'], [1, 'NA'], [2, '\u00a0']]);
    expect(() => numericColumn(t, 'y', 'outcome')).toThrow('column "y" (outcome) is missing on every one of its 2 rows');
    // A covariate may be all missing: the balance check says so as a warning.
    expect(Array.from(numericColumn(t, 'y', 'covariate').missing)).toEqual([1, 1]);
  });
  test('a decimal comma gets a hint', () => {
    const t = tableFromRows([['y'], ['2,75']]);
    expect(() => numericColumn(t, 'y', 'outcome')).toThrow(/found "2,75"; it looks like a number written with a decimal comma.*\(2\.75\)/);
  });
  test('the list of columns is cut: 12 names at most, each cut after 40 characters', () => {
    const header = ['a'.repeat(5000), ...Array.from({ length: 30 }, (_, i) => `c${i}`)];
    const t = tableFromRows([header, header.map(() => 1)]);
    let message = '';
    try {
      numericColumn(t, 'b'.repeat(5000), 'score');
    } catch (e) {
      message = (e as Error).message;
    }
    expect(message).toMatch(/^--score: no column named "b{37}…"; the columns are "a{37}…", "c0", .*"c10", … \(31 columns in all\)$/);
    expect(message.length).toBeLessThan(250);
  });
});
