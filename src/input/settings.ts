/**
 * A settings block: a two-column range of name/value pairs on a sheet, so
 * that one block drives every Cutline formula of a workbook. Names are
 * matched ignoring case, spaces, hyphens and underscores; blank rows and a
 * title row ("setting", "value") are skipped; a setting a function does not
 * use is ignored by it (the same block serves all ten functions).
 *
 * @example
 *   readSettings([['kernel', 'uniform'], ['draws', 1999], ['', '']], 'settings')
 *   // { kernel: 'uniform', draws: 1999 }
 */
import { BANDWIDTH_RULES, BandwidthRule, KERNEL_NAMES, KernelName, limitProblem, MultiplierName, VARIANCE_NAMES, VarianceName } from '../engine';
import { cellNumber, showCell, trimBlank } from './cells';
import { readMultiples } from './multiples';
import { errorCode, offsetAddress, RangeInputError } from './range';
import { Cell } from './table';

export interface Settings {
  kernel?: KernelName;
  variance?: VarianceName;
  rule?: BandwidthRule | 'typed';
  eligible?: 'above' | 'below';
  level?: number;
  donut?: number;
  draws?: number;
  seed?: number;
  grid?: number;
  trim?: number;
  multiplier?: MultiplierName;
  sensitivity?: number[];
  densityBin?: number;
  densityBandwidth?: number;
  trendGuard?: 'on' | 'off';
}

type Kind = { choices: readonly string[] } | { number: 'positive' | 'whole' | 'nonnegative' | 'level' } | { list: true };

/** Every setting: its name as shown, the field it fills, what its value may be. */
export const SETTINGS: ReadonlyArray<{ name: string; field: keyof Settings; kind: Kind; meaning: string }> = [
  { name: 'kernel', field: 'kernel', kind: { choices: KERNEL_NAMES }, meaning: 'kernel weights of the local fits (triangular)' },
  // Not 'cluster': a worksheet function takes no cluster column.
  {
    name: 'variance',
    field: 'variance',
    kind: { choices: VARIANCE_NAMES.filter((v) => v !== 'cluster') },
    meaning: `standard errors: nearest-neighbour or heteroskedasticity-robust (${VARIANCE_NAMES.find((v) => v !== 'cluster' && !v.startsWith('hc'))})`,
  },
  // "typed" (as a summary sheet records a typed bandwidth) leaves the choice to the bandwidth argument.
  { name: 'rule', field: 'rule', kind: { choices: [...BANDWIDTH_RULES, 'typed'] }, meaning: 'bandwidth rule when no bandwidth is typed (mse); "typed": the bandwidth argument is used' },
  { name: 'eligible', field: 'eligible', kind: { choices: ['above', 'below'] }, meaning: 'side of the cutoff offered the treatment (read from the take-up jump)' },
  { name: 'level', field: 'level', kind: { number: 'level' }, meaning: 'confidence level of the intervals (0.95)' },
  { name: 'donut', field: 'donut', kind: { number: 'positive' }, meaning: 'leave out units with |score − cutoff| below this (none)' },
  { name: 'draws', field: 'draws', kind: { number: 'whole' }, meaning: 'bootstrap draws of the validity test (999)' },
  { name: 'seed', field: 'seed', kind: { number: 'whole' }, meaning: 'seed of the random draws (1)' },
  { name: 'grid', field: 'grid', kind: { number: 'whole' }, meaning: 'outcome grid size of the validity test (30)' },
  { name: 'trim', field: 'trim', kind: { number: 'nonnegative' }, meaning: 'variance floor of the validity test (0.1)' },
  { name: 'multiplier', field: 'multiplier', kind: { choices: ['normal', 'rademacher'] }, meaning: 'bootstrap multipliers of the validity test (normal)' },
  { name: 'trend guard', field: 'trendGuard', kind: { choices: ['on', 'off'] }, meaning: 'VALIDITY: also test the trend-adjusted outcomes and report the larger p-value (on); off: the published test alone' },
  { name: 'sensitivity', field: 'sensitivity', kind: { list: true }, meaning: 'multiples of the test bandwidth to rerun the validity test at, e.g. "0.5,1,2" (none)' },
  { name: 'density bin', field: 'densityBin', kind: { number: 'positive' }, meaning: "bin width of McCrary's density test (rule of thumb)" },
  { name: 'density bandwidth', field: 'densityBandwidth', kind: { number: 'positive' }, meaning: "bandwidth of McCrary's density test (rule of thumb)" },
];

const squeeze = (s: string): string => s.toLowerCase().replace(/[\s_-]+/g, '');
const BY_KEY = new Map(SETTINGS.map((s) => [squeeze(s.name), s]));

function text(cell: unknown): string | undefined {
  if (cell === null || cell === undefined) return undefined;
  const s = trimBlank(String(cell));
  return s === '' ? undefined : s;
}

/** The settings of a two-column range; errors name the argument, the cell and the allowed values. */
export function readSettings(cells: unknown[][] | null | undefined, argument = 'settings', address?: string): Settings {
  const out: Settings = {};
  if (cells === null || cells === undefined) return out;
  const width = cells[0]?.length ?? 0;
  if (width !== 2) {
    throw new RangeInputError(`${argument} must be a range of two columns (name, value); it has ${width} column${width === 1 ? '' : 's'}`, argument, 'shape');
  }
  const where = (r: number, c: number): string => {
    const at = offsetAddress(address, r, c);
    return at ? `cell ${at}` : `row ${r + 1}`;
  };
  cells.forEach((row, r) => {
    const name = text(row[0]);
    if (name === undefined) return;
    const key = squeeze(name);
    if (r === 0 && (key === 'setting' || key === 'name')) return;
    const spec = BY_KEY.get(key);
    if (!spec) {
      throw new RangeInputError(
        `${argument}, ${where(r, 0)}: ${JSON.stringify(name)} is not a setting; the settings are ${SETTINGS.map((s) => s.name).join(', ')}`,
        argument,
      );
    }
    if (out[spec.field] !== undefined) throw new RangeInputError(`${argument}, ${where(r, 0)}: ${spec.name} is given twice`, argument);
    const cell = row[1];
    const code = errorCode(cell);
    if (code !== undefined) throw new RangeInputError(`${argument}, ${where(r, 1)}: ${spec.name} holds the error ${code}`, argument);
    const raw = text(cell);
    if (raw === undefined) return; // a blank value leaves the default
    const bad = (problem: string): never => {
      throw new RangeInputError(`${argument}, ${where(r, 1)}: ${spec.name} ${problem}; it holds ${showCell(cell as Cell)}`, argument);
    };
    const badValue = (wanted: string): never => bad(`must be ${wanted}`);
    const k = spec.kind;
    if ('choices' in k) {
      const v = raw.toLowerCase();
      if (!k.choices.includes(v)) badValue(`one of ${k.choices.join(', ')}`);
      (out as Record<string, unknown>)[spec.field] = v;
    } else if ('list' in k) {
      // The reader of --sensitivity too (multiples.ts): the same texts accepted, the same words for a bad entry.
      try {
        out.sensitivity = readMultiples(raw, `${argument}, ${where(r, 1)}: ${spec.name}`);
      } catch (e) {
        throw new RangeInputError((e as Error).message, argument);
      }
    } else {
      const v = cellNumber(cell as Cell);
      const want = k.number;
      const ok =
        typeof v === 'number' &&
        Number.isFinite(v) &&
        (want === 'positive' ? v > 0 : want === 'whole' ? Number.isInteger(v) && v >= 0 : want === 'nonnegative' ? v >= 0 : v > 0 && v < 1);
      if (!ok) {
        badValue(
          want === 'positive' ? 'a positive number' : want === 'whole' ? 'a whole number' : want === 'nonnegative' ? 'a number of at least 0' : 'a number between 0 and 1',
        );
      }
      // The engine's limits (as the command line and the task pane check them): refused here, naming the cell.
      const field = spec.field;
      const problem = field === 'draws' || field === 'seed' || field === 'grid' ? limitProblem(field, v as number) : null;
      if (problem) bad(problem);
      (out as Record<string, unknown>)[spec.field] = v;
    }
  });
  return out;
}
