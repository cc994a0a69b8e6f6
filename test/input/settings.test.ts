// src/input/settings.ts: the settings block (name/value pairs). Expectations
// are the names and limits listed in the module (Cutline's own).
import { RangeInputError } from '../../src/input/range';
import { readSettings, SETTINGS } from '../../src/input/settings';

const message = (f: () => unknown): string => {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(RangeInputError);
    return (e as Error).message;
  }
  throw new Error('no error');
};

test('names ignore case, spaces, hyphens and underscores; blank rows and a title row are skipped', () => {
  expect(
    readSettings([
      ['Setting', 'Value'],
      ['KERNEL', 'Uniform'],
      ['', ''],
      ['trend_guard', 'OFF'],
      ['Density-Bandwidth', '2.5'],
      ['sensitivity', '0.5, 1, 2'],
      ['level', 0.9],
      [null, null],
      ['seed', ''],
    ]),
  ).toEqual({ kernel: 'uniform', trendGuard: 'off', densityBandwidth: 2.5, sensitivity: [0.5, 1, 2], level: 0.9 });
  expect(readSettings(null)).toEqual({});
  expect(readSettings([['sensitivity', 'off']])).toEqual({ sensitivity: [] });
});

test('errors name the cell and what is allowed', () => {
  expect(message(() => readSettings([['kernel', 'gaussian']], 'settings', 'Setup!B2:C5'))).toBe(
    'settings, cell Setup!C2: kernel must be one of triangular, epanechnikov, uniform; it holds "gaussian"',
  );
  expect(message(() => readSettings([['draws', 10], ['draws', 20]]))).toBe('settings, row 2: draws is given twice');
  expect(message(() => readSettings([['level', 95]]))).toBe('settings, row 1: level must be a number between 0 and 1; it holds "95"');
  expect(message(() => readSettings([['donut', -1]]))).toBe('settings, row 1: donut must be a positive number; it holds "-1"');
  expect(message(() => readSettings([['kernel']]))).toBe('settings must be a range of two columns (name, value); it has 1 column');
  expect(message(() => readSettings([['bandwidth', 3]]))).toMatch(/^settings, row 1: "bandwidth" is not a setting; the settings are kernel, /);
  expect(message(() => readSettings([['variance', 'cluster']]))).toMatch(/variance must be one of hc0, hc1, (nn|neighbours); it holds "cluster"/);
});

test('every setting has a distinct name and a meaning', () => {
  const names = SETTINGS.map((s) => s.name);
  expect(new Set(names).size).toBe(names.length);
  for (const s of SETTINGS) expect(s.meaning.length).toBeGreaterThan(10);
});

// The one blank rule of cells.ts (trimBlank): NBSP and the zero-width space are blank like a space.
test('names and values lose NBSP and zero-width spaces at their ends; a cell of them alone is blank', () => {
  expect(
    readSettings([
      ['\u200bkernel\u00a0', 'uniform\u200b'],
      ['\u200b', '\u200b'],
      ['seed', '\u00a0\u200b'],
      ['draws', '\u200b499\u00a0'],
    ]),
  ).toEqual({ kernel: 'uniform', draws: 499 });
});

// The engine's limits (VALIDITY_LIMITS: draws 1–100000, seed 0–4294967295, grid 2–1000), as the
// command line and the task pane check them: refused here, naming the cell, not later by the engine.
test('draws, seed and grid outside the engine limits are refused with the cell', () => {
  expect(message(() => readSettings([['draws', 0]]))).toBe('settings, row 1: draws must be a whole number of at least 1; it holds "0"');
  expect(message(() => readSettings([['draws', 100001]]))).toBe('settings, row 1: draws must be at most 100000 (more draws only slow the check down); it holds "100001"');
  expect(message(() => readSettings([['seed', 4294967296]]))).toBe('settings, row 1: seed must be a whole number from 0 to 4294967295; it holds "4294967296"');
  expect(message(() => readSettings([['grid', 1]]))).toBe('settings, row 1: grid must be a whole number of at least 2; it holds "1"');
  expect(readSettings([['draws', 100000], ['seed', 4294967295], ['grid', 1000]])).toEqual({ draws: 100000, seed: 4294967295, grid: 1000 });
});
