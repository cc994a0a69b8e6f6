/**
 * The one error type the engine and the input layer throw for a problem the
 * user can fix (bad data, a bandwidth that holds too few units, an option out
 * of range). Faces turn it into an exit status 2, an Excel error value or a
 * message in the task pane; anything else is a bug.
 */
export class CutlineError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CutlineError';
  }
}

/** Throws a CutlineError naming `what` unless `ok`. */
export function require_(ok: boolean, message: string): asserts ok {
  if (!ok) throw new CutlineError(message);
}
