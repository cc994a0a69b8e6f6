/** One line on standard error for a CutlineError, in the command line's words. */
import { CutlineError } from '../engine';
import { flagHint } from './flagHints';

/**
 * An error in the command line's words: the engine's argument becomes its flag
 * ("--flag: …", flagHints.ts) and a 0-based index the file's row (the header
 * is row 1).
 */
export function errorLine(e: CutlineError): string {
  let message = e.message.replace(/\s*\n\s*/g, ' ');
  if (e.index !== undefined) message = `row ${e.index + 2}: ${message}`;
  const flag = flagHint(e);
  // A message of the command line's own ("--sensitivity must be …") names its flag already.
  return flag === undefined || message.startsWith(flag) ? message : `${flag}: ${message}`;
}
