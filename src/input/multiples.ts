/**
 * Sensitivity multiples as a user types them, in a settings block or after
 * `--sensitivity`: positive multiples of the test bandwidth separated by
 * commas (or semicolons, or spaces), each read by the cell rules of cells.ts
 * (decimal numbers; no hexadecimal, no Infinity), or `off` / `none` for no
 * rerun. The one reader of both faces, so they accept the same texts and say
 * the same thing about a bad one.
 *
 * @example
 *   readMultiples('0.5, 1;2', 'sensitivity') // [0.5, 1, 2]
 *   readMultiples('OFF', '--sensitivity')    // []
 *   readMultiples('0.5,x', '--sensitivity')  // CutlineError: --sensitivity must be positive multiples separated by commas, or off; got "x"
 */
import { CutlineError } from '../engine';
import { trimBlank, typedNumber } from './cells';

/** What the multiples must be, after the name of the option or argument. */
export const MULTIPLES_WANTED = 'positive multiples separated by commas, or off';

/** The multiples of `text`, or a CutlineError (argument `sensitivity`) naming `name` and the first bad entry. */
export function readMultiples(text: string, name: string): number[] {
  const t = trimBlank(text);
  const word = t.toLowerCase();
  if (word === 'off' || word === 'none') return [];
  const entries = t.split(/[\s\u0085\u200b]*[,;][\s\u0085\u200b]*|[\s\u0085\u200b]+/);
  const values = entries.map(multiple);
  const bad = values.findIndex((v) => v === undefined);
  if (bad >= 0) {
    throw new CutlineError(`${name} must be ${MULTIPLES_WANTED}; got ${JSON.stringify(entries[bad])}`, { code: 'option', argument: 'sensitivity' });
  }
  return values as number[];
}

/** One entry: a positive number typed by the cell rules (typedNumber: a word such as TRUE or NA is not a multiple). */
function multiple(entry: string): number | undefined {
  const v = typedNumber(entry);
  return v !== undefined && v > 0 ? v : undefined;
}
