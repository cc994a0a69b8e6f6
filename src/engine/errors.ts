/**
 * The one error type the engine and the input layer throw for a problem the
 * user can fix (bad data, a bandwidth that holds too few units, an option out
 * of range). Faces turn it into an exit status 2, an Excel error value or a
 * message in the task pane; anything else is a bug.
 *
 * The message is plain words that name no command-line flag and no document;
 * `argument` says which input is at fault in the engine's words (`cutoff`,
 * `score`, `treated`, `outcome`, `bandwidth`, `donut`, `draws`, …, or a column's
 * name) and `index` the 0-based position in the caller's column, so that each
 * face can say it in its own terms (the CLI: its flag and the file's row; a
 * worksheet function: its parameter and the range's cell).
 *
 * @example
 *   throw new CutlineError('not a number (NaN)', { code: 'bad-value', argument: 'score', index: 4 });
 */
export type ErrorCode =
  /** A value that is not a finite number, or a treated value other than 0/1. */
  | 'bad-value'
  /** Columns of unequal length. */
  | 'length'
  /** An option out of range or of the wrong kind. */
  | 'option'
  /** No unit on a side of the cutoff (at all, or in the window). */
  | 'empty-side'
  /** Too few units or distinct values for a calculation. */
  | 'too-few'
  /** A column without variation where one is needed. */
  | 'constant'
  /** Anything else the user can fix by changing the data or the options. */
  | 'invalid';

export interface ErrorDetail {
  code?: ErrorCode;
  argument?: string;
  index?: number;
}

export class CutlineError extends Error {
  readonly code: ErrorCode;
  readonly argument?: string;
  readonly index?: number;

  constructor(message: string, detail: ErrorDetail = {}) {
    super(message);
    this.name = 'CutlineError';
    this.code = detail.code ?? 'invalid';
    this.argument = detail.argument;
    this.index = detail.index;
  }
}

