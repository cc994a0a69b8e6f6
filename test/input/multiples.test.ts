// src/input/multiples.ts: sensitivity multiples, the one reader of the settings
// block and of `cutline check --sensitivity`. Expectations are the module's
// rules (Cutline's own) and the cell rules of cells.ts for each entry.
import { parseArgs } from '../../src/cli/args';
import { parseCheckSpec } from '../../src/cli/checkFile';
import { errorLine } from '../../src/cli/errorLine';
import { CutlineError } from '../../src/engine';
import { readMultiples } from '../../src/input/multiples';
import { readSettings } from '../../src/input/settings';

const fromSettings = (text: string): number[] | string => {
  try {
    return readSettings([['sensitivity', text]]).sensitivity!;
  } catch (e) {
    return (e as Error).message;
  }
};
const fromCli = (text: string): number[] | string => {
  try {
    return parseCheckSpec(parseArgs(['check', 'x.csv', '--score', 's', '--treated', 't', '--outcome', 'y', '--cutoff', '0', '--sensitivity', text])).options.sensitivity!;
  } catch (e) {
    return errorLine(e as CutlineError);
  }
};

test('commas, semicolons or spaces between entries; off and none for no rerun', () => {
  expect(readMultiples('0.5,0.75,1,1.5,2', 'sensitivity')).toEqual([0.5, 0.75, 1, 1.5, 2]);
  expect(readMultiples(' 0.5, 1 ;2\u00a0 3e0\u200b', 'sensitivity')).toEqual([0.5, 1, 2, 3]);
  expect(readMultiples('OFF', 'sensitivity')).toEqual([]);
  expect(readMultiples('\u200bnone ', 'sensitivity')).toEqual([]);
});

test('a bad entry is named with the option: zero, negative, hexadecimal, Infinity, words, an empty entry', () => {
  const say = (text: string): string => {
    try {
      readMultiples(text, '--sensitivity');
    } catch (e) {
      expect(e).toBeInstanceOf(CutlineError);
      expect((e as CutlineError).argument).toBe('sensitivity');
      return (e as Error).message;
    }
    throw new Error('no error');
  };
  expect(say('0.5,x')).toBe('--sensitivity must be positive multiples separated by commas, or off; got "x"');
  expect(say('1,0')).toMatch(/; got "0"$/);
  expect(say('1,-2')).toMatch(/; got "-2"$/);
  expect(say('0x10')).toMatch(/; got "0x10"$/);
  expect(say('1,Infinity')).toMatch(/; got "Infinity"$/);
  expect(say('1,TRUE')).toMatch(/; got "TRUE"$/);
  expect(say('1,NA')).toMatch(/; got "NA"$/);
  expect(say('1,,2')).toMatch(/; got ""$/);
  expect(say('1e999')).toMatch(/; got "1e999"$/);
});

test('the settings block and --sensitivity accept and refuse the same texts, in the same words', () => {
  for (const text of ['0.5,1,2', '0.5; 1; 2', '0.5 1 2', 'off', 'None', '1,0x10', '1,,2', '0', '-1', 'two', '1,Infinity']) {
    const s = fromSettings(text);
    const c = fromCli(text);
    if (Array.isArray(s)) expect(c).toEqual(s);
    else {
      expect(s.replace(/^settings, row 1: sensitivity /, '')).toBe((c as string).replace(/^--sensitivity /, ''));
      expect(s).toMatch(/^settings, row 1: sensitivity must be positive multiples separated by commas, or off; got "/);
      expect(c).toMatch(/^--sensitivity must be positive multiples separated by commas, or off; got "/);
    }
  }
});
