/**
 * The command-line flag behind an engine error: the engine names the input at
 * fault in its own words (CutlineError's `argument`: `donut`, `sensitivity`,
 * `bandwidth`, …) and the command line says it as the option the user types.
 * Decided by that structured field alone, never by the message's wording.
 *
 * @example flagHint(new CutlineError('the donut (radius 2) leaves too few units …', { argument: 'donut' })) // '--donut'
 */
import { CutlineError } from '../engine';

/** The command-line spelling of each argument the engine may name in an error. */
export const FLAGS: Readonly<Record<string, string>> = {
  cutoff: '--cutoff',
  score: '--score',
  treated: '--treated',
  outcome: '--outcome',
  covariate: '--covariate',
  cluster: '--cluster',
  within: '--within',
  bandwidth: '--bandwidth',
  rule: '--bandwidth-rule',
  kernel: '--kernel',
  variance: '--variance',
  donut: '--donut',
  draws: '--draws',
  seed: '--seed',
  grid: '--grid',
  trim: '--trim',
  multiplier: '--multiplier',
  sensitivity: '--sensitivity',
  density: '--density-bin/--density-bandwidth',
};

/** The flag of the error's argument, or undefined (no argument, or one the command line has no flag for). */
export function flagHint(e: CutlineError): string | undefined {
  return e.argument !== undefined && Object.prototype.hasOwnProperty.call(FLAGS, e.argument) ? FLAGS[e.argument] : undefined;
}
