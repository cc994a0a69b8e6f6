// The command line says the engine's errors in its own words: the argument as its flag, a
// 0-based index as the file's row (the header is row 1, so index 0 is row 2).
import { CutlineError } from '../../src/engine';
import { errorLine } from '../../src/cli/errorLine';

test('argument → flag, index → row', () => {
  expect(errorLine(new CutlineError('column "bill": not a number (NaN)', { code: 'bad-value', argument: 'outcome', index: 3 }))).toBe(
    '--outcome: row 5: column "bill": not a number (NaN)',
  );
  expect(errorLine(new CutlineError('the donut 5 leaves no unit below the cutoff', { argument: 'donut' }))).toBe('--donut: the donut 5 leaves no unit below the cutoff');
  expect(errorLine(new CutlineError("McCrary's density test could not be computed: x", { argument: 'density' }))).toBe(
    "--density-bin/--density-bandwidth: McCrary's density test could not be computed: x",
  );
});

test('a message without an argument, or with one the command line has no flag for, is said as it is', () => {
  expect(errorLine(new CutlineError('the window (bandwidth 0.004) holds 1 unit above the cutoff'))).toBe('the window (bandwidth 0.004) holds 1 unit above the cutoff');
  expect(errorLine(new CutlineError('arm must be 1 or 0', { argument: 'arm' }))).toBe('arm must be 1 or 0');
});
