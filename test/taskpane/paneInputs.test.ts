/**
 * The guided check's inputs (src/taskpane/paneInputs.ts): each bad input
 * gives a message for its own field and no check; good inputs give the
 * check's input, options and where the data sit.
 */
import { checkForm, DEFAULT_FORM, PaneForm } from '../../src/taskpane/paneInputs';
import { DataBlock } from '../../src/report/workbookPort';

const block: DataBlock = {
  sheet: 'Data',
  header: ['id', 'energy_burden', 'retrofit', 'heating_bill'],
  rows: [
    [1, 52, 0, 1800],
    [2, 58, 1, 1500],
    [3, 61, 1, 1400],
    [4, 66, 0, 1700],
    [5, 70, 1, null],
  ],
  firstRow: 4,
  firstCol: 1,
};

const good: PaneForm = { ...DEFAULT_FORM, score: 'energy_burden', treated: 'retrofit', outcomes: 'heating_bill', cutoff: '60' };

describe('checkForm', () => {
  test('good inputs: no message, the check ready, columns placed on the sheet', () => {
    const { errors, ready } = checkForm(good, block);
    expect(errors).toEqual({});
    expect(ready!.options).toMatchObject({ cutoff: 60, draws: 999, seed: 1, rule: 'mse', bins: true });
    expect(ready!.data).toEqual({ sheet: 'Data', firstRow: 4, lastRow: 8, columns: { id: 1, energy_burden: 2, retrofit: 3, heating_bill: 4 } });
    expect(ready!.source).toBe('Data!B3:E8');
    expect(Array.from(ready!.input.outcomes[0].missing!)).toEqual([0, 0, 0, 0, 1]);
  });

  test.each([
    ['no data read yet', good, undefined, 'data', /Choose where the data are/],
    ['the data could not be read', good, new Error('No cells are selected'), 'data', /No cells are selected/],
    ['a header missing', { ...good, score: 'burden' }, block, 'score', /no column named "burden"; the columns are "id", "energy_burden"/],
    ['no outcome', { ...good, outcomes: ' , ' }, block, 'outcomes', /at least one outcome/],
    ['a non-numeric cutoff', { ...good, cutoff: 'sixty' }, block, 'cutoff', /cutoff must be a number \(for example 60\); it is "sixty"/],
    ['a cutoff outside the scores', { ...good, cutoff: '80' }, block, 'cutoff', /cutoff 80 is outside the scores \(52 to 70\)/],
    ['a typed bandwidth that is not positive', { ...good, bandwidthMode: 'typed', bandwidth: '-2' }, block, 'bandwidth', /bandwidth must be a positive number/],
    ['draws not whole', { ...good, draws: '99.5' }, block, 'draws', /draws must be a whole number of at least 1; it is "99.5"/],
  ] as const)('%s: a message beside its field, no check', (_what, form, data, field, message) => {
    const { errors, ready } = checkForm(form as PaneForm, data as DataBlock | Error | undefined);
    expect(errors[field as keyof typeof errors]).toMatch(message);
    expect(ready).toBeUndefined();
  });

  test('a text value in the score column names the sheet row', () => {
    const rows = block.rows.map((r) => [...r]);
    rows[2][1] = 'high';
    const { errors, ready } = checkForm(good, { ...block, rows });
    expect(errors.score).toBe('column "energy_burden" (score), row 6: not a number, found "high"');
    expect(ready).toBeUndefined();
  });

  test('treated not 0/1 names the sheet row', () => {
    const rows = block.rows.map((r) => [...r]);
    rows[3][2] = 2;
    const { errors } = checkForm(good, { ...block, rows });
    expect(errors.treated).toBe('column "retrofit" (treated), row 7: treated must be 0, 1, TRUE or FALSE, found "2"');
  });

  // The one blank rule of cells.ts (trimBlank): zero-width spaces and NBSP pasted around a typed value are blank.
  test('names and numbers typed with zero-width spaces or NBSP around them are read as without them', () => {
    const { errors, ready } = checkForm(
      { ...good, score: '\u200benergy_burden', outcomes: 'heating_bill\u200b, \u00a0', cutoff: '\u200b60\u00a0', seed: '\u200b7' },
      block,
    );
    expect(errors).toEqual({});
    expect(ready!.options).toMatchObject({ cutoff: 60, seed: 7 });
    expect(ready!.input.outcomes.map((o) => o.name)).toEqual(['heating_bill']);
  });
});
