/**
 * The task pane: the guided check, one short step at a time (data, columns,
 * cutoff and eligible side, bandwidth, checks, run), each field's problem
 * shown beside it (paneInputs.ts), Run enabled only when no field has one,
 * a progress bar through the long steps with Cancel (runGuidedCheck.ts),
 * and the headline verdicts once the sheet is written.
 *
 * The workbook is reached only through the workbook port: the Excel API in
 * Excel; outside Office (the browser test) the page is handed a port as
 * `window.cutlineWorkbook` before it loads.
 */
import { ExcelWorkbook } from '../report/excelWorkbook';
import { trimBlank } from '../input/cells';
import { DataBlock, DataSource, isCancel, WorkbookPort } from '../report/workbookPort';
import { detectEligible } from './engine';
import { checkForm, CLUSTER_NOTE, DEFAULT_FORM, Field, FieldErrors, nameList, PaneForm, ReadyCheck } from './paneInputs';
import { runGuidedCheck } from './runGuidedCheck';

declare global {
  interface Window {
    cutlineWorkbook?: WorkbookPort;
    /** Set by a test page whose workbook is built after the page's scripts load. */
    cutlineWorkbookReady?: Promise<WorkbookPort>;
  }
}

const STEPS = 6;
/** The fields of each step (for the marks on the step list and the Run summary). */
const STEP_FIELDS: Record<number, Field[]> = {
  1: ['data'],
  2: ['score', 'treated', 'outcomes', 'covariates', 'cluster'],
  3: ['cutoff', 'eligible'],
  4: ['bandwidth'],
  5: ['draws', 'seed'],
  6: [],
};
const FIELD_LABEL: Record<Field, string> = {
  data: 'the data',
  score: 'score',
  treated: 'treated',
  outcomes: 'outcomes',
  covariates: 'covariates',
  cluster: 'cluster',
  cutoff: 'cutoff',
  eligible: 'eligible side',
  bandwidth: 'bandwidth',
  draws: 'draws',
  seed: 'seed',
};

const $ = <T extends HTMLElement>(id: string): T => document.getElementById(id) as T;
const value = (id: string): string => $<HTMLInputElement>(id).value;
const checked = (id: string): boolean => $<HTMLInputElement>(id).checked;

let port: WorkbookPort | undefined;
let block: DataBlock | Error | undefined;
let step = 1;
let running = false;
let cancelRequested = false;
let lastReady: ReadyCheck | undefined;

function form(): PaneForm {
  return {
    score: value('score'),
    treated: value('treated'),
    outcomes: value('outcomes'),
    covariates: value('covariates'),
    cluster: value('cluster'),
    cutoff: value('cutoff'),
    eligible: value('eligible') as PaneForm['eligible'],
    bandwidthMode: checked('bw-typed') ? 'typed' : 'rule',
    rule: value('rule') as PaneForm['rule'],
    bandwidth: value('bandwidth'),
    density: checked('check-density'),
    balance: checked('check-balance'),
    sensitivity: checked('check-sensitivity'),
    draws: value('draws'),
    seed: value('seed'),
  };
}

function showStep(n: number): void {
  step = Math.min(STEPS, Math.max(1, n));
  for (let k = 1; k <= STEPS; k++) $(`step-${k}`).hidden = k !== step;
  document.querySelectorAll<HTMLElement>('.steps li').forEach((li) => {
    const current = Number(li.dataset.step) === step;
    li.classList.toggle('current', current);
    if (current) li.setAttribute('aria-current', 'step');
    else li.removeAttribute('aria-current');
  });
  $<HTMLButtonElement>('back').disabled = step === 1 || running;
  $<HTMLButtonElement>('next').disabled = step === STEPS || running;
}

/** Writes each field's message beside it, marks the steps, enables Run when nothing is wrong. */
function refresh(): FieldErrors {
  const f = form();
  const { errors, ready } = checkForm(f, block);
  lastReady = ready;
  for (const field of Object.keys(FIELD_LABEL) as Field[]) {
    const box = document.getElementById(`error-${field}`);
    if (box) box.textContent = errors[field] ?? '';
    const input = document.getElementById(field);
    if (input) input.setAttribute('aria-invalid', errors[field] ? 'true' : 'false');
  }
  document.querySelectorAll<HTMLElement>('.steps li').forEach((li) => {
    li.classList.toggle('invalid', STEP_FIELDS[Number(li.dataset.step)].some((x) => errors[x] !== undefined));
  });
  const wrong = (Object.keys(errors) as Field[]).map((x) => FIELD_LABEL[x]);
  $('run-blocked').textContent = wrong.length ? `Run needs: ${wrong.join(', ')} (see the message beside each field).` : '';
  $<HTMLButtonElement>('run').disabled = !ready || running || !port;
  $('note-cluster').textContent = trimBlank(f.cluster) !== '' && !errors.cluster ? CLUSTER_NOTE : '';
  summarizeChoices(f);
  detected(f, ready);
  return errors;
}

function summarizeChoices(f: PaneForm): void {
  const items = [
    block && !(block instanceof Error) ? `Data: ${block.rows.length} rows of ${block.sheet}` : 'Data: not chosen',
    `Score: ${f.score || '—'}; treated: ${f.treated || '—'}`,
    `Outcomes: ${nameList(f.outcomes).join(', ') || '—'}`,
    `Cutoff: ${f.cutoff || '—'}`,
    `Bandwidth: ${f.bandwidthMode === 'typed' ? f.bandwidth || '—' : `rule ${f.rule}`}`,
    `Draws ${f.draws}, seed ${f.seed}`,
  ];
  const ul = $('choices');
  ul.replaceChildren(...items.map((t) => Object.assign(document.createElement('li'), { textContent: t })));
}

/** The side where take-up jumps up, detected with the engine once the columns and the cutoff are valid. */
let detectedKey = '';
function detected(f: PaneForm, ready: ReadyCheck | undefined): void {
  const line = $('eligible-detected');
  if (!ready) {
    line.textContent = 'The eligible side is detected from the take-up jump once the columns and the cutoff are valid.';
    return;
  }
  const key = `${f.score}|${f.treated}|${f.cutoff}`;
  if (key === detectedKey) return;
  detectedKey = key;
  try {
    const side = detectEligible(ready.input.score.values, ready.input.treated.values, [ready.input.score.missing!, ready.input.treated.missing!], ready.options.cutoff);
    line.textContent = `Detected: take-up is higher ${side === 'above' ? 'at or above' : 'below'} the cutoff, so that side is eligible. Choose a side to override.`;
  } catch (e) {
    line.textContent = `The take-up jump could not be estimated: ${e instanceof Error ? e.message : String(e)}`;
  }
}

function source(): DataSource {
  if (checked('source-selection')) return { kind: 'selection' };
  if (checked('source-table')) return { kind: 'table', name: value('table-name') };
  return { kind: 'used' };
}

async function readData(): Promise<void> {
  if (!port) return;
  try {
    block = await port.readData(source());
    $('data-summary').textContent = `${block.rows.length} rows and ${block.header.length} columns on ${block.sheet}: ${block.header.join(', ')}.`;
    const list = $('headers');
    list.replaceChildren(...block.header.map((h) => Object.assign(document.createElement('option'), { value: h })));
    $('headers-shown').textContent = `Headers: ${block.header.join(', ')}`;
  } catch (e) {
    block = e instanceof Error ? e : new Error(String(e));
    $('data-summary').textContent = '';
  }
  detectedKey = '';
  refresh();
}

function setProgress(fraction: number, what: string): void {
  const pct = Math.round(Math.max(0, Math.min(1, fraction)) * 100);
  $('progress').setAttribute('aria-valuenow', String(pct));
  $('progress-fill').style.width = `${pct}%`;
  $('progress-text').textContent = what;
}

async function run(): Promise<void> {
  const ready = lastReady;
  if (!port || !ready || running) return;
  running = true;
  cancelRequested = false;
  $<HTMLButtonElement>('run').disabled = true;
  $<HTMLButtonElement>('cancel').disabled = false;
  $('verdicts').hidden = true;
  showStep(step);
  try {
    const done = await runGuidedCheck(port, ready, setProgress, () => cancelRequested);
    $('verdict-list').replaceChildren(
      ...done.verdicts.map((v) => Object.assign(document.createElement('li'), { textContent: v.text, className: v.concern ? 'concern' : 'fine' })),
    );
    $('verdicts').hidden = false;
    $('live-hint').textContent = `The sheet’s results are live formulas: type a new cutoff into ${done.plan.cutoffCell} of “${done.sheet}” and they recalculate.`;
    $('pane-status').textContent = `The summary is on the sheet “${done.sheet}”.`;
  } catch (e) {
    if (isCancel(e)) {
      setProgress(0, 'Cancelled: nothing was written.');
    } else {
      setProgress(0, `The check stopped: ${e instanceof Error ? e.message : String(e)}`);
    }
  } finally {
    running = false;
    $<HTMLButtonElement>('cancel').disabled = true;
    showStep(step);
    refresh();
  }
}

function wire(): void {
  const f = DEFAULT_FORM;
  $<HTMLInputElement>('draws').value = f.draws;
  $<HTMLInputElement>('seed').value = f.seed;
  for (const id of ['score', 'treated', 'outcomes', 'covariates', 'cluster', 'cutoff', 'bandwidth', 'draws', 'seed']) {
    $(id).addEventListener('input', () => refresh());
  }
  for (const id of ['eligible', 'rule', 'check-density', 'check-balance', 'check-sensitivity']) $(id).addEventListener('change', () => refresh());
  for (const id of ['bw-rule', 'bw-typed']) {
    $(id).addEventListener('change', () => {
      $<HTMLInputElement>('bandwidth').disabled = !checked('bw-typed');
      $<HTMLSelectElement>('rule').disabled = checked('bw-typed');
      refresh();
    });
  }
  for (const id of ['source-used', 'source-selection', 'source-table']) {
    $(id).addEventListener('change', () => ($<HTMLSelectElement>('table-name').disabled = !checked('source-table')));
  }
  $('read-data').addEventListener('click', () => void readData());
  $('next').addEventListener('click', () => showStep(step + 1));
  $('back').addEventListener('click', () => showStep(step - 1));
  $('run').addEventListener('click', () => void run());
  $('cancel').addEventListener('click', () => {
    cancelRequested = true;
    $('progress-text').textContent = 'Cancelling…';
  });
  showStep(1);
  refresh();
}

async function start(host: unknown): Promise<void> {
  if (host === 'Excel' || (typeof Office !== 'undefined' && host === Office.HostType?.Excel)) port = new ExcelWorkbook();
  else port = window.cutlineWorkbook ?? (window.cutlineWorkbookReady ? await window.cutlineWorkbookReady : undefined);
  $('pane-status').textContent = port
    ? 'Point at your data, name the columns, set the cutoff: the check writes a live summary sheet.'
    : 'Open this pane from Excel (Home › Cutline) to check your data.';
  if (port) {
    try {
      const tables = await port.tableNames();
      $('table-name').replaceChildren(...tables.map((t) => Object.assign(document.createElement('option'), { value: t, textContent: t })));
      if (tables.length === 0) $<HTMLInputElement>('source-table').disabled = true;
    } catch {
      $<HTMLInputElement>('source-table').disabled = true;
    }
  }
  refresh();
}

wire();
if (typeof Office !== 'undefined' && typeof Office.onReady === 'function') {
  void Office.onReady().then((info) => start(info.host));
} else void start(null);
