// The validity test's limits on draws and seed are the engine's (VALIDITY_LIMITS,
// src/engine/limits.ts): the task pane, the command line and the engine accept
// and refuse the same boundaries. Expectations are the limits as documented in
// README.md (draws 1 to 100000, seed 0 to 4294967295).
import { parseArgs } from '../../src/cli/args';
import { parseCheckSpec } from '../../src/cli/checkFile';
import { resolveValidityOptions, VALIDITY_LIMITS } from '../../src/engine';
import { checkForm, DEFAULT_FORM, PaneForm } from '../../src/taskpane/paneInputs';
import { DataBlock } from '../../src/report/workbookPort';

const block: DataBlock = {
  sheet: 'Data',
  header: ['energy_burden', 'retrofit', 'heating_bill'],
  rows: [
    [52, 0, 1800],
    [58, 1, 1500],
    [61, 1, 1400],
    [66, 0, 1700],
  ],
  firstRow: 2,
  firstCol: 1,
};
const form: PaneForm = { ...DEFAULT_FORM, score: 'energy_burden', treated: 'retrofit', outcomes: 'heating_bill', cutoff: '60' };

const pane = (field: 'draws' | 'seed', v: string): boolean => checkForm({ ...form, [field]: v }, block).errors[field] === undefined;
const cli = (field: 'draws' | 'seed', v: string): boolean => {
  try {
    parseCheckSpec(parseArgs(['check', 'x.csv', '--score', 's', '--treated', 't', '--outcome', 'y', '--cutoff', '0', `--${field}`, v]));
    return true;
  } catch {
    return false;
  }
};
const engine = (field: 'draws' | 'seed', v: number): boolean => {
  try {
    resolveValidityOptions({ bandwidth: 1, kernel: 'triangular', [field]: v });
    return true;
  } catch {
    return false;
  }
};

test('the limits are the documented ones', () => {
  expect(VALIDITY_LIMITS.draws).toMatchObject({ min: 1, max: 100000 });
  expect(VALIDITY_LIMITS.seed).toMatchObject({ min: 0, max: 4294967295 });
  expect(VALIDITY_LIMITS.grid).toMatchObject({ min: 2, max: 1000 });
});

test.each([
  ['draws', 0, false],
  ['draws', 1, true],
  ['draws', 98, true],
  ['draws', 100000, true],
  ['draws', 100001, false],
  ['draws', 2.5, false],
  ['seed', -1, false],
  ['seed', 0, true],
  ['seed', 2 ** 31, true],
  ['seed', 4294967295, true],
  ['seed', 4294967296, false],
] as const)('%s %d: pane, command line and engine agree (%s)', (field, v, ok) => {
  expect(pane(field, String(v))).toBe(ok);
  expect(cli(field, String(v))).toBe(ok);
  expect(engine(field, v)).toBe(ok);
});

test('the pane says what the command line says about a value out of bounds', () => {
  expect(checkForm({ ...form, draws: '100001' }, block).errors.draws).toBe('draws must be at most 100000 (more draws only slow the check down); it is "100001"');
  expect(checkForm({ ...form, seed: '-1' }, block).errors.seed).toBe('seed must be a whole number from 0 to 4294967295; it is "-1"');
  expect(checkForm({ ...form, seed: '0x10' }, block).errors.seed).toBe('seed must be a whole number from 0 to 4294967295; it is "0x10"');
  expect(checkForm({ ...form, draws: '' }, block).errors.draws).toBe('draws must be a whole number of at least 1; it is empty');
});
