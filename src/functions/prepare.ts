/**
 * The arguments every function shares, read once per call: the ranges (as
 * checked columns), the cutoff, the optional bandwidth, the settings block
 * and the detail flag; and the key its result is remembered under.
 */
import { CutlineError, ValidityOptions } from '../engine';
import { dataCellPlace, RangeColumn, RangeInputError } from '../input/range';
import { Settings } from '../input/settings';
import {
  bandwidthArgument,
  engineOptions,
  flagArgument,
  InvocationLike,
  numberArgument,
  rangesKey,
  RangeSpec,
  readRanges,
  remembered,
  settingsArgument,
  settingsKey,
} from './call';

export interface PreparedCall {
  /** The checked columns (read when first asked for: a remembered result needs only the key). */
  readonly cols: RangeColumn[];
  cutoff: number;
  bandwidth?: number;
  settings: Settings;
  /** The engine's options, with the columns' missing masks. */
  readonly opts: ValidityOptions;
  detail: boolean;
  /** The function, the ranges' cells, cutoff, bandwidth and settings (the detail flag only changes the layout). */
  key: string;
  /** The engine's result for this call, computed once while remembered; an engine error about a row names its cell. */
  result<T>(compute: () => T): T;
}

export interface CallArguments {
  ranges: RangeSpec[];
  cutoff: unknown;
  bandwidth?: unknown;
  settings: unknown;
  /** Position of the settings argument among the function's parameters (for its address). */
  settingsPosition: number;
  detail: unknown;
  /** Anything else the result depends on (the `at` values, the arm). */
  extraKey?: string;
}

export function prepareCall(fn: string, a: CallArguments, invocation?: InvocationLike | null): PreparedCall {
  const seenRanges = rangesKey(a.ranges);
  const cellsKey = seenRanges.key;
  const cutoff = numberArgument('cutoff', a.cutoff);
  const bandwidth = bandwidthArgument(a.bandwidth);
  const settings = settingsArgument(a.settings, invocation, a.settingsPosition);
  const detail = flagArgument(a.detail);
  let cols: RangeColumn[] | undefined;
  let opts: ValidityOptions | undefined;
  return {
    get cols(): RangeColumn[] {
      return (cols ??= readRanges(a.ranges, seenRanges, invocation));
    },
    get opts(): ValidityOptions {
      if (!opts) {
        const missing: Record<string, Uint8Array> = {};
        a.ranges.forEach((r, k) => (missing[r.argument] = this.cols[k].missing));
        opts = engineOptions(bandwidth, settings, missing);
      }
      return opts;
    },
    cutoff,
    bandwidth,
    settings,
    detail,
    key: `${fn}|${cellsKey}|${cutoff}|${bandwidth ?? ''}|${settingsKey(settings)}|${a.extraKey ?? ''}`,
    result<T>(compute: () => T): T {
      return remembered(this.key, () => {
        try {
          return compute();
        } catch (e) {
          throw located(e, a.ranges, invocation);
        }
      });
    },
  };
}

/** An engine error that names an argument and a 0-based row, said with the range's cell. */
function located(e: unknown, specs: RangeSpec[], invocation?: InvocationLike | null): unknown {
  if (!(e instanceof CutlineError)) return e;
  const { argument, index } = e as CutlineError & { argument?: string; index?: number };
  const spec = specs.find((s) => s.argument === argument);
  if (!spec || index === undefined || !Number.isInteger(index)) return e;
  const place = dataCellPlace({ argument: spec.argument, cells: spec.cells, address: invocation?.parameterAddresses?.[spec.position] }, index);
  return new RangeInputError(`${spec.argument}: ${place}: ${e.message}`, spec.argument);
}

/** The range arguments, in order, from (name, cells, binary) triples. */
export function ranges(...specs: Array<[string, unknown, boolean?]>): RangeSpec[] {
  return specs.map(([argument, cells, binary], position) => ({ argument, cells: cells as unknown[][], position, binary }));
}
