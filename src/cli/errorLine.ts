/** One line on standard error for a CutlineError, in the command line's words. */
import { CutlineError } from '../engine';
import { withFlags } from './flagHints';

/** The command-line spelling of each argument the engine may name in an error. */
const FLAGS: Record<string, string> = {
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

/**
 * An error in the command line's words: the engine's argument becomes its flag
 * ("--flag: …"), a 0-based index the file's row (the header is row 1), and
 * the options the message names in its own words are added (flagHints.ts).
 */
export function errorLine(e: CutlineError): string {
  let message = withFlags(e.message.replace(/\s*\n\s*/g, ' '));
  if (e.index !== undefined) message = `row ${e.index + 2}: ${message}`;
  const flag = e.argument !== undefined ? FLAGS[e.argument] : undefined;
  // A message of the command line's own ("--sensitivity must be …") names its flag already.
  return flag === undefined || message.startsWith(flag) ? message : `${flag}: ${message}`;
}
