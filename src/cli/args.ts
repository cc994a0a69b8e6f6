/**
 * The arguments of `cutline check` (DESIGN.md "The command line"), parsed
 * without a library so that every message is Cutline's own and names the
 * option. Values come as `--name value` or `--name=value`.
 */
import { CutlineError } from '../engine';
import { typedNumber } from '../input/cells';

export interface OptionSpec {
  /** Takes a value (false: a flag). */
  value: boolean;
  /** May be given more than once. */
  repeat?: boolean;
}

const CHECK_OPTIONS: Record<string, OptionSpec> = {
  score: { value: true },
  treated: { value: true },
  outcome: { value: true, repeat: true },
  cutoff: { value: true },
  sheet: { value: true },
  bandwidth: { value: true },
  'bandwidth-rule': { value: true },
  kernel: { value: true },
  variance: { value: true },
  draws: { value: true },
  seed: { value: true },
  grid: { value: true },
  trim: { value: true },
  multiplier: { value: true },
  'trend-guard': { value: true },
  sensitivity: { value: true },
  within: { value: true },
  'density-bin': { value: true },
  'density-bandwidth': { value: true },
  covariate: { value: true, repeat: true },
  cluster: { value: true },
  donut: { value: true },
  bins: { value: false },
  out: { value: true },
  html: { value: true },
  'out-dir': { value: true },
  format: { value: true },
  force: { value: false },
  jobs: { value: true },
  json: { value: false },
};

export interface ParsedArgs {
  command: string;
  /** Every input given (FILE or folder), in order. */
  files: string[];
  values: Map<string, string[]>;
  flags: Set<string>;
}

export function parseArgs(argv: string[], specs: Record<string, OptionSpec> = CHECK_OPTIONS): ParsedArgs {
  const [command, ...rest] = argv;
  const out: ParsedArgs = { command: command ?? '', files: [], values: new Map(), flags: new Set() };
  for (let i = 0; i < rest.length; i++) {
    const a = rest[i];
    if (!a.startsWith('--')) {
      out.files.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = a.slice(2, eq < 0 ? undefined : eq);
    const spec = specs[name];
    if (!spec) throw new CutlineError(`unknown option --${name} (see \`cutline help\`)`);
    if (!spec.value) {
      if (eq >= 0) throw new CutlineError(`--${name} takes no value`);
      if (out.flags.has(name)) throw new CutlineError(`--${name} is given twice; give it once`);
      out.flags.add(name);
      continue;
    }
    let v: string | undefined;
    if (eq >= 0) v = a.slice(eq + 1);
    else {
      v = rest[i + 1];
      if (v === undefined || (v.startsWith('--') && !/^--?\d/.test(v))) throw new CutlineError(`--${name} needs a value`);
      i++;
    }
    const list = out.values.get(name) ?? [];
    if (list.length > 0 && !spec.repeat) {
      throw new CutlineError(`--${name} is given twice (${JSON.stringify(list[0])} and ${JSON.stringify(v)}); give it once`);
    }
    list.push(v);
    out.values.set(name, list);
  }
  return out;
}

export function one(args: ParsedArgs, name: string): string | undefined {
  return args.values.get(name)?.[0];
}

export function required(args: ParsedArgs, name: string, what: string): string {
  const v = one(args, name);
  if (v === undefined || v.trim() === '') throw new CutlineError(`--${name} is required: ${what}`);
  return v;
}

export function numberOption(args: ParsedArgs, name: string, check?: (v: number) => string | null): number | undefined {
  const s = one(args, name);
  if (s === undefined) return undefined;
  // Read as the task pane reads a typed number (cells.ts): decimal only, no 0x10, 0b1, 0o7 or Infinity.
  const v = typedNumber(s);
  if (v === undefined) throw new CutlineError(`--${name} must be a number, got ${JSON.stringify(s)}`);
  const problem = check?.(v);
  if (problem) throw new CutlineError(`--${name} ${problem}, got ${s}`);
  return v;
}

export function choiceOption<T extends string>(args: ParsedArgs, name: string, choices: readonly T[]): T | undefined {
  const s = one(args, name);
  if (s === undefined) return undefined;
  if (!(choices as readonly string[]).includes(s)) {
    throw new CutlineError(`--${name} must be one of ${choices.join(', ')}; got ${JSON.stringify(s)}`);
  }
  return s as T;
}
