/**
 * The guided check's inputs, checked as the user fills them in: each
 * problem is a message for the field it concerns (the data, a column, the
 * cutoff, …), in the words of the shared input layer (src/input), and the
 * check is ready only when no field has one. Pure: no DOM, no workbook.
 *
 * @example
 *   const { errors, ready } = checkForm(form, block);
 *   errors.cutoff; // 'cutoff must be a number (for example 60); it is "sixty"'
 */
import { DataRanges } from '../report/summaryModel';
import { DataBlock } from '../report/workbookPort';
import { columnLetters } from '../report/formulas';
import { labelColumn, numericColumn } from '../input/columns';
import { Table, tableFromRows } from '../input/table';
import { trimBlank, typedNumber } from '../input/cells';
import { limitProblem } from './engine';
import type { CheckInput, CheckOptions } from './engine';

export type Field = 'data' | 'score' | 'treated' | 'outcomes' | 'covariates' | 'cluster' | 'cutoff' | 'eligible' | 'bandwidth' | 'draws' | 'seed';

export interface PaneForm {
  score: string;
  treated: string;
  /** Outcome column names, separated by commas. */
  outcomes: string;
  covariates: string;
  cluster: string;
  cutoff: string;
  eligible: 'detect' | 'above' | 'below';
  bandwidthMode: 'rule' | 'typed';
  rule: 'mse' | 'ik' | 'cer';
  bandwidth: string;
  density: boolean;
  balance: boolean;
  sensitivity: boolean;
  draws: string;
  seed: string;
}

export const DEFAULT_FORM: PaneForm = {
  score: '',
  treated: '',
  outcomes: '',
  covariates: '',
  cluster: '',
  cutoff: '',
  eligible: 'detect',
  bandwidthMode: 'rule',
  rule: 'mse',
  bandwidth: '',
  density: true,
  balance: true,
  sensitivity: true,
  draws: '999',
  seed: '1',
};

export type FieldErrors = Partial<Record<Field, string>>;

/** Said beside the cluster field when one is named. */
export const CLUSTER_NOTE =
  'The summary sheet’s formulas treat units as independent (the worksheet functions take no cluster column), so the cluster is not used here; cutline check --cluster gives clustered standard errors.';

export interface ReadyCheck {
  input: CheckInput;
  options: CheckOptions;
  /** Where each column sits in the workbook (for the formulas). */
  data: DataRanges;
  names: { score: string; treated: string; covariates: string[] };
  /** The range the data came from, for the sheet's "Data:" line. */
  source: string;
  density: boolean;
  /** Scores' range and the eligible side to detect or use. */
  eligible: 'detect' | 'above' | 'below';
}

/** Names in a comma-separated field, trimmed, blanks dropped. */
export const nameList = (s: string): string[] =>
  s
    .split(',')
    .map(trimBlank)
    .filter((x) => x !== '');

/** A message of the input layer without the command line's option in front ("--score: …"). */
export const plain = (e: unknown): string => (e instanceof Error ? e.message : String(e)).replace(/^--[a-z-]+:\s*/, '');

/** The data's address, as the sheet's source line shows it. */
export function blockAddress(b: DataBlock): string {
  const last = b.firstRow + b.rows.length - 1;
  return `${b.sheet}!${columnLetters(b.firstCol)}${b.firstRow - 1}:${columnLetters(b.firstCol + b.header.length - 1)}${last}`;
}

/** A whole number within the engine's limits for the option (the command line checks the same), or a message. */
function whole(v: string, what: 'draws' | 'seed'): { n?: number; error?: string } {
  const t = trimBlank(v);
  const n = typedNumber(t);
  const problem = limitProblem(what, n ?? NaN);
  if (problem) return { error: `${what} ${problem}; it is ${t === '' ? 'empty' : JSON.stringify(v)}` };
  return { n };
}

/**
 * Every field's problem, and the check's input when there is none. `block`
 * is the data read from the workbook, or the reason it could not be read.
 */
export function checkForm(form: PaneForm, block: DataBlock | Error | undefined): { errors: FieldErrors; ready?: ReadyCheck } {
  const errors: FieldErrors = {};
  if (block === undefined) return { errors: { data: 'Choose where the data are, then press “Use these data”.' } };
  if (block instanceof Error) return { errors: { data: block.message } };
  const table: Table = tableFromRows(block.rows, { header: block.header, firstRow: block.firstRow });

  const one = (field: Field, name: string, role: 'score' | 'treated'): ReturnType<typeof numericColumn> | undefined => {
    if (trimBlank(name) === '') {
      errors[field] = `Type the header of the ${role === 'score' ? 'score' : 'treated'} column.`;
      return undefined;
    }
    try {
      return numericColumn(table, trimBlank(name), role);
    } catch (e) {
      errors[field] = plain(e);
      return undefined;
    }
  };
  const many = (field: Field, names: string[], role: 'outcome' | 'covariate'): ReturnType<typeof numericColumn>[] => {
    const out: ReturnType<typeof numericColumn>[] = [];
    for (const n of names) {
      try {
        out.push(numericColumn(table, n, role));
      } catch (e) {
        errors[field] = plain(e);
        break;
      }
    }
    return out;
  };

  const score = one('score', form.score, 'score');
  const treated = one('treated', form.treated, 'treated');
  const outcomeNames = nameList(form.outcomes);
  if (outcomeNames.length === 0) errors.outcomes = 'Type the header of at least one outcome column.';
  const outcomes = many('outcomes', outcomeNames, 'outcome');
  const covariates = many('covariates', nameList(form.covariates), 'covariate');
  if (trimBlank(form.cluster) !== '') {
    try {
      // Checked for its header only (see CLUSTER_NOTE).
      labelColumn(table, trimBlank(form.cluster), 'cluster');
    } catch (e) {
      errors.cluster = plain(e);
    }
  }

  const c = trimBlank(form.cutoff);
  const cutoff = typedNumber(c) ?? NaN;
  if (c === '' || !Number.isFinite(cutoff)) {
    errors.cutoff = `cutoff must be a number (for example 60); it is ${c === '' ? 'empty' : JSON.stringify(form.cutoff)}`;
  } else if (score) {
    let lo = Infinity;
    let hi = -Infinity;
    score.values.forEach((v, i) => {
      if (score.missing[i]) return;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    });
    if (!(cutoff > lo && cutoff <= hi)) {
      errors.cutoff = `cutoff ${c} is outside the scores (${lo} to ${hi}): both sides of the cutoff need units`;
    }
  }

  let bandwidth: number | undefined;
  if (form.bandwidthMode === 'typed') {
    const b = typedNumber(form.bandwidth) ?? NaN;
    if (trimBlank(form.bandwidth) === '' || !(b > 0) || !Number.isFinite(b)) {
      errors.bandwidth = `bandwidth must be a positive number in score units; it is ${trimBlank(form.bandwidth) === '' ? 'empty' : JSON.stringify(form.bandwidth)}`;
    } else bandwidth = b;
  }
  const draws = whole(form.draws, 'draws');
  if (draws.error) errors.draws = draws.error;
  const seed = whole(form.seed, 'seed');
  if (seed.error) errors.seed = seed.error;

  if (Object.keys(errors).length > 0 || !score || !treated) return { errors };
  const columns: Record<string, number> = {};
  block.header.forEach((h, k) => (columns[h] = block.firstCol + k));
  const input: CheckInput = {
    score,
    treated,
    outcomes,
    ...(form.balance && covariates.length > 0 ? { covariates } : {}),
    // Not the cluster: the worksheet functions take no cluster column, and the sheet's formulas must give
    // the pane's numbers; the cluster is checked (its column must exist) and the pane says so beside it.
  };
  const options: CheckOptions = {
    cutoff,
    bins: true,
    draws: draws.n,
    seed: seed.n,
    ...(bandwidth !== undefined ? { bandwidth } : { rule: form.rule }),
    ...(form.sensitivity ? {} : { sensitivity: [] }),
  };
  return {
    errors,
    ready: {
      input,
      options,
      data: { sheet: block.sheet, firstRow: block.firstRow, lastRow: block.firstRow + block.rows.length - 1, columns },
      names: { score: score.name, treated: treated.name, covariates: form.balance ? covariates.map((x) => x.name) : [] },
      source: blockAddress(block),
      density: form.density,
      eligible: form.eligible,
    },
  };
}
