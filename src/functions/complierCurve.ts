/**
 * What COMPLIERCDF and COMPLIERDENSITY share: the `at` values and the arm,
 * and the spilled layout (one value per `at`, in the shape of `at`; with
 * detail, a table of at/value pairs and the summary rows).
 */
import { complierCdfAt, complierDensityAt, ComplierCurveResult } from '../engine';
import { rangeNumbers, RangeInputError } from '../input/range';
import { trimBlank } from '../input/cells';
import { Cell, cellOf, guarded, InvocationLike, Matrix } from './call';
import { commonRows, table } from './detail';
import { prepareCall, ranges } from './prepare';

type CurveEntry = typeof complierCdfAt | typeof complierDensityAt;

/** The whole call of COMPLIERCDF or COMPLIERDENSITY: the arguments in the functions' order, one engine entry. */
export function complierCurveCall(
  name: 'COMPLIERCDF' | 'COMPLIERDENSITY',
  entry: CurveEntry,
  what: 'cdf' | 'density',
  args: { score: any[][]; treated: any[][]; outcome: any[][]; cutoff: number; at: any[][]; arm: any; bandwidth?: number; settings?: any[][]; detail?: boolean },
  invocation?: InvocationLike,
): any[][] {
  return guarded(name, (): Matrix => {
    const a = atArgument(args.at, invocation);
    const side = armArgument(args.arm);
    const c = prepareCall(
      name,
      {
        ranges: ranges(['score', args.score], ['treated', args.treated, true], ['outcome', args.outcome]),
        cutoff: args.cutoff,
        bandwidth: args.bandwidth,
        settings: args.settings,
        settingsPosition: 7,
        detail: args.detail,
        extraKey: `${a.key}|${side}`,
      },
      invocation,
    );
    const r = c.result(() => entry(c.cols[0].values, c.cols[1].values, c.cols[2].values, c.cutoff, a.values, side, c.opts));
    return curveMatrix(r, what, c.detail, a.row);
  });
}

/** The arm: 1 (or TRUE, "treated") for treated compliers, 0 (FALSE, "untreated") for untreated ones. */
export function armArgument(v: unknown): 0 | 1 {
  if (v === 1 || v === true) return 1;
  if (v === 0 || v === false) return 0;
  const s = typeof v === 'string' ? trimBlank(v).toLowerCase() : '';
  if (s === 'treated' || s === '1' || s === 'true') return 1;
  if (s === 'untreated' || s === '0' || s === 'false') return 0;
  throw new RangeInputError(`arm must be 1 (treated compliers) or 0 (untreated compliers); it is ${JSON.stringify(v)}`, 'arm');
}

export function atArgument(at: unknown, invocation: InvocationLike | null | undefined): { values: number[]; key: string; row: boolean } {
  const cells = Array.isArray(at) ? (at as unknown[][]) : [[at]];
  const values = rangeNumbers({ argument: 'at', cells, address: invocation?.parameterAddresses?.[4] });
  const row = cells.length === 1 && cells[0].length > 1;
  return { values, key: `${row ? 'row' : 'column'}:${values.join(',')}`, row };
}

export function curveMatrix(r: ComplierCurveResult, what: string, detail: boolean, row: boolean): Matrix {
  if (!detail) return row ? [r.values.map((v) => cellOf(v))] : r.values.map((v) => [cellOf(v)]);
  const rows: Cell[][] = [['at', `${what}_${r.arm === 1 ? 'treated' : 'untreated'}`], ...r.at.map((a, i): Cell[] => [a, cellOf(r.values[i])])];
  for (const s of r.violations) rows.push([what === 'density' ? 'negative' : 'decreasing', `${s.from} to ${s.to}`]);
  return table([...rows, ...commonRows(r)]);
}
