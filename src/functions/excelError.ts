/**
 * Errors as Excel shows them: a CustomFunctions.Error whose message names the
 * function, the argument and, for a bad cell, the cell. `#VALUE!` for an
 * argument that cannot be used as given (a bad cell, ranges of unequal
 * length, an unknown setting); `#N/A` for a statistic these data cannot
 * give (a side of the cutoff without units, a constant column); `#NUM!` for
 * a result that is not a finite number (Excel shows no message with it).
 */
import { CutlineError, ErrorCode } from '../engine';
import { RangeInputError } from '../input/range';

export type ExcelErrorCode = '#VALUE!' | '#N/A' | '#NUM!';

const CODE_NAME: Record<ExcelErrorCode, 'invalidValue' | 'notAvailable' | 'invalidNumber'> = {
  '#VALUE!': 'invalidValue',
  '#N/A': 'notAvailable',
  '#NUM!': 'invalidNumber',
};

/** The Excel error for a code and message, built by the runtime's CustomFunctions.Error. */
export function excelError(code: ExcelErrorCode, message?: string): CustomFunctions.Error {
  const codes = CustomFunctions.ErrorCode as unknown as Record<string, CustomFunctions.ErrorCode>;
  const c = codes?.[CODE_NAME[code]] ?? (code as unknown as CustomFunctions.ErrorCode);
  return code === '#NUM!' ? new CustomFunctions.Error(c) : new CustomFunctions.Error(c, message);
}

// Engine codes for a problem with an argument's value (the rest: the data cannot give the statistic).
// Decided by the code alone, never by the message's wording: an engine error thrown without a code
// has 'invalid' (CutlineError's default), a finding about the data at these settings, hence #N/A. The
// options a user can get wrong in a worksheet are checked before the engine runs (range.ts,
// settings.ts, call.ts), as RangeInputErrors naming the cell, hence #VALUE!.
const ARGUMENT_CODES: ReadonlySet<ErrorCode> = new Set<ErrorCode>(['bad-value', 'length', 'option']);

/** Any error thrown while a function ran, as the Excel error it returns. */
export function toExcelError(fn: string, e: unknown): CustomFunctions.Error {
  // Already an Excel error (a function said why it has no number): as it is.
  if (e instanceof CustomFunctions.Error) return e;
  if (e instanceof RangeInputError) return excelError('#VALUE!', `CUTLINE.${fn}: ${e.message}`);
  if (e instanceof CutlineError) {
    const { code, argument } = e;
    return excelError(ARGUMENT_CODES.has(code) ? '#VALUE!' : '#N/A', `CUTLINE.${fn}: ${argument && !e.message.startsWith(argument) ? `${argument}: ` : ''}${e.message}`);
  }
  // Not a problem the user can fix: say so in one line, never a stack trace.
  const text = e instanceof Error ? e.message : String(e);
  return excelError('#N/A', `CUTLINE.${fn} could not compute this (${text}); please report it with the data that cause it`);
}
