/**
 * `cutline check` over several files or a folder: each file checked with the
 * same columns and options and its reports written into `--out-dir`, files
 * run in parallel in worker threads (as many as the machine has cores, or
 * `--jobs`), a progress bar on standard error when it is a terminal, and an
 * index (index.csv, index.html) of every file's verdicts or error. A file
 * that fails is listed with its error; the others still run.
 */
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { Worker } from 'worker_threads';
import { CutlineError } from '../engine';
import { indexCsv, indexHtml, IndexRow } from './batchIndex';
import { CheckSpec } from './checkFile';
import { checkOutputPath, writeAtomic } from './outputPaths';
import type { ReportRequest } from './reportFiles';

const INPUT = /\.(csv|xlsx|xlsm)$/i;

/** The input files: files as given, a folder's CSV/XLSX files (not recursive, by name). */
function batchInputs(args: string[]): string[] {
  const files: string[] = [];
  for (const a of args) {
    let st: fs.Stats;
    try {
      st = fs.statSync(a);
    } catch {
      throw new CutlineError(`${a}: no such file or folder`);
    }
    if (st.isDirectory()) {
      const inside = fs
        .readdirSync(a)
        .filter((n) => INPUT.test(n) && !n.startsWith('.') && !n.startsWith('~$'))
        .sort()
        .map((n) => path.join(a, n));
      if (inside.length === 0) throw new CutlineError(`${a}: the folder holds no .csv, .xlsx or .xlsm file`);
      files.push(...inside);
    } else files.push(a);
  }
  return files;
}

export interface BatchJob {
  file: string;
  req: ReportRequest;
  reports: string[];
}

/** Report names: the input's name without extension, then `.report.xlsx` / `.report.html`; same names get -2, -3, … */
export function planBatch(files: string[], outDir: string, formats: Array<'xlsx' | 'html'>): BatchJob[] {
  const used = new Set<string>();
  return files.map((file) => {
    const stem = path.basename(file).replace(/\.[^.]+$/, '');
    let name = stem;
    for (let k = 2; used.has(name.toLowerCase()); k++) name = `${stem}-${k}`;
    used.add(name.toLowerCase());
    const req: ReportRequest = {};
    const reports: string[] = [];
    for (const f of formats) {
      const rel = `${name}.report.${f}`;
      reports.push(rel);
      req[f] = path.join(outDir, rel);
    }
    return { file, req, reports };
  });
}

export interface WorkerTask {
  file: string;
  req: ReportRequest;
  spec: CheckSpec;
}

export type WorkerReply = { ok: true; headline: IndexRow['headline'] } | { ok: false; error: string };

interface Progress {
  tick(): void;
  stop(): void;
}

async function progressBar(total: number): Promise<Progress> {
  if (!process.stderr.isTTY) return { tick: () => undefined, stop: () => undefined };
  const { SingleBar, Presets } = await import('cli-progress');
  const bar = new SingleBar({ stream: process.stderr, format: 'cutline {bar} {value}/{total} files | {eta_formatted} left', hideCursor: true }, Presets.shades_classic);
  bar.start(total, 0);
  return { tick: () => bar.increment(), stop: () => bar.stop() };
}

/** Runs the jobs in `jobs` worker threads of `script` (this bundle); replies in input order. */
async function runPool(script: string, tasks: WorkerTask[], jobs: number, onDone: () => void): Promise<WorkerReply[]> {
  const replies: WorkerReply[] = new Array(tasks.length);
  let next = 0;
  const one = (): Promise<void> =>
    new Promise((resolve) => {
      const w = new Worker(script, { workerData: { cutlineBatchWorker: true } });
      let current = -1;
      const give = (): void => {
        if (next >= tasks.length) {
          void w.terminate();
          resolve();
          return;
        }
        current = next++;
        w.postMessage(tasks[current]);
      };
      w.on('message', (m: WorkerReply) => {
        replies[current] = m;
        onDone();
        give();
      });
      w.on('error', (e) => {
        // A crash of the worker fails its file; the others go on in a new worker.
        if (current >= 0 && replies[current] === undefined) {
          replies[current] = { ok: false, error: `internal error: ${e.message}` };
          onDone();
        }
        void one().then(resolve);
      });
      give();
    });
  await Promise.all(Array.from({ length: Math.min(jobs, tasks.length) }, one));
  return replies;
}

export interface BatchOptions {
  inputs: string[];
  outDir: string;
  formats: Array<'xlsx' | 'html'>;
  force: boolean;
  jobs?: number;
  spec: CheckSpec;
  /** The script a worker thread runs (the bundle of main.ts). */
  script: string;
}

/** Runs the batch; resolves to the number of files that failed. */
export async function runBatch(o: BatchOptions): Promise<{ rows: IndexRow[]; failed: number }> {
  const files = batchInputs(o.inputs);
  const outDir = path.resolve(o.outDir);
  const parent = path.dirname(outDir);
  if (!fs.existsSync(outDir)) {
    if (!fs.existsSync(parent)) throw new CutlineError(`--out-dir: the folder ${parent} does not exist (create it first)`);
    try {
      fs.mkdirSync(outDir);
    } catch (e) {
      throw new CutlineError(`--out-dir: cannot create ${outDir} (${(e as NodeJS.ErrnoException).code === 'EACCES' ? 'permission denied' : (e as NodeJS.ErrnoException).code})`);
    }
  } else if (!fs.statSync(outDir).isDirectory()) throw new CutlineError(`--out-dir: ${o.outDir} is a file, not a folder`);
  for (const f of files) {
    if (path.resolve(path.dirname(f)) === outDir) throw new CutlineError(`--out-dir: ${o.outDir} holds the input files; write the reports to another folder`);
  }
  const plan = planBatch(files, outDir, o.formats);
  for (const j of plan) {
    if (j.req.xlsx) checkOutputPath('--out-dir', j.req.xlsx, files, o.force);
    if (j.req.html) checkOutputPath('--out-dir', j.req.html, files, o.force);
  }
  checkOutputPath('--out-dir', path.join(outDir, 'index.csv'), files, o.force);
  checkOutputPath('--out-dir', path.join(outDir, 'index.html'), files, o.force);

  const cores = typeof os.availableParallelism === 'function' ? os.availableParallelism() : os.cpus().length;
  const bar = await progressBar(plan.length);
  const replies = await runPool(
    o.script,
    plan.map((j) => ({ file: j.file, req: j.req, spec: o.spec })),
    Math.max(1, o.jobs ?? cores),
    () => bar.tick(),
  );
  bar.stop();
  const rows: IndexRow[] = plan.map((j, i) => {
    const r = replies[i];
    return r.ok ? { file: j.file, headline: r.headline, reports: j.reports } : { file: j.file, error: r.error, reports: [] };
  });
  writeAtomic('--out-dir', path.join(outDir, 'index.csv'), indexCsv(rows, o.spec.outcomeNames));
  writeAtomic('--out-dir', path.join(outDir, 'index.html'), indexHtml(rows, o.spec.outcomeNames));
  return { rows, failed: rows.filter((r) => r.error).length };
}
