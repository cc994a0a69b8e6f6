/**
 * `cutline check FILE --score COL --treated COL --outcome COL … --cutoff NUM`
 * (DESIGN.md). Exit status 0 on success, 2 for bad input (one line on
 * standard error saying what and where), 1 for anything else.
 */
import * as fs from 'fs';
import * as v8 from 'v8';
import { isMainThread, workerData } from 'worker_threads';
import { CheckResult, CutlineError } from '../engine';
import { numberOption, one, parseArgs, ParsedArgs } from './args';
import { checkFile, parseCheckSpec } from './checkFile';
import { errorLine } from './errorLine';
import { toJson } from './json';
import { checkOutputPath } from './outputPaths';
import { readable } from './readable';

const USAGE = `usage: cutline check FILE --score COL --treated COL --outcome COL [--outcome COL …] --cutoff NUM
  [--sheet NAME] [--bandwidth NUM | --bandwidth-rule mse|ik|cer] [--kernel triangular|epanechnikov|uniform]
  [--variance neighbours|hc0|hc1|cluster] [--cluster COL] [--covariate COL …]
  [--draws N] [--seed N] [--grid N] [--trim NUM] [--multiplier normal|rademacher] [--trend-guard on|off]
  [--sensitivity 0.5,0.75,1,1.5,2|off] [--within COL] [--density-bin NUM] [--density-bandwidth NUM]
  [--donut NUM] [--json [--bins]] [--out REPORT.xlsx] [--html REPORT.html] [--force]
       cutline check FILE|FOLDER … (same options) --out-dir DIR [--format xlsx,html] [--jobs N] [--force]
`;

/** The JSON document without the plot data that reports asked the engine for (unless --bins). */
function withoutPlotData(r: CheckResult): CheckResult {
  return {
    ...r,
    bins: undefined,
    outcomes: r.outcomes.map((o) => {
      if (!o.compliers) return o;
      const { density_treated, density_untreated, negative_treated, negative_untreated, density_bandwidth, ...rest } = o.compliers;
      void [density_treated, density_untreated, negative_treated, negative_untreated, density_bandwidth];
      return { ...o, compliers: rest };
    }),
  };
}

function formatsOption(s: string | undefined): Array<'xlsx' | 'html'> {
  if (s === undefined) return ['xlsx', 'html'];
  const parts = s.split(',').map((p) => p.trim().toLowerCase());
  const bad = parts.find((p) => p !== 'xlsx' && p !== 'html');
  if (bad !== undefined || parts.length === 0) throw new CutlineError(`--format must be xlsx, html or xlsx,html; got ${JSON.stringify(s)}`);
  return [...new Set(parts)] as Array<'xlsx' | 'html'>;
}

async function batch(args: ParsedArgs): Promise<number> {
  for (const single of ['out', 'html']) {
    if (args.values.has(single)) throw new CutlineError(`--${single} names one report file; for several files give --out-dir DIR (and --format xlsx,html)`);
  }
  for (const flag of ['json', 'bins']) {
    if (args.flags.has(flag)) throw new CutlineError(`--${flag} applies to one file; several files write reports and an index into --out-dir`);
  }
  const outDir = one(args, 'out-dir');
  if (outDir === undefined) throw new CutlineError('several input files, or a folder, need --out-dir DIR for their reports and index');
  const formats = formatsOption(one(args, 'format'));
  const jobs = numberOption(args, 'jobs', (v) => (Number.isInteger(v) && v >= 1 ? null : 'must be a whole number of at least 1'));
  const spec = parseCheckSpec(args);
  // A check runs each of its long loops once: V8 compiles a loop while it runs (on-stack replacement),
  // by default on a background thread while the loop goes on unoptimised. One check gains from that
  // (a core is free: 0.92 s against 0.94 s of wall time at 1M rows, README "Speed"); in a batch every
  // core runs a check, so each compiles its loops on the spot (less CPU in all). Never a result changes.
  v8.setFlagsFromString('--no-concurrent-osr');
  // Loaded on demand, like the report writers: a plain check does not pay for d3, resvg or workers.
  const { runBatch } = await import('./batch');
  const { rows, failed } = await runBatch({ inputs: args.files, outDir, formats, force: args.flags.has('force'), jobs, spec, script: __filename });
  process.stdout.write(`${rows.length} files: ${rows.length - failed} checked, ${failed} failed; index in ${outDir}/index.html and index.csv\n`);
  for (const r of rows) if (r.error) process.stderr.write(`cutline: ${r.file}: ${r.error}\n`);
  return failed > 0 ? 2 : 0;
}

async function check(args: ParsedArgs): Promise<number> {
  const file = args.files[0];
  if (!file) throw new CutlineError('check needs an input FILE (CSV or XLSX)');
  const isFolder = args.files.length === 1 && fs.existsSync(file) && fs.statSync(file).isDirectory();
  if (isFolder && !args.values.has('out-dir')) {
    throw new CutlineError(`${file} is a folder, not a CSV or XLSX file; to check every file in it, give --out-dir DIR for their reports`);
  }
  if (args.files.length > 1 || isFolder || args.values.has('out-dir')) return batch(args);
  for (const only of ['format', 'jobs']) {
    if (args.values.has(only)) throw new CutlineError(`--${only} applies to several files with --out-dir DIR`);
  }
  const xlsx = one(args, 'out');
  const html = one(args, 'html');
  if (xlsx !== undefined && !/\.xlsx$/i.test(xlsx)) throw new CutlineError(`--out writes an Excel workbook: give a name ending in .xlsx, got ${JSON.stringify(xlsx)}`);
  if (html !== undefined && !/\.html?$/i.test(html)) throw new CutlineError(`--html writes a web page: give a name ending in .html, got ${JSON.stringify(html)}`);
  const force = args.flags.has('force');
  if (xlsx !== undefined) checkOutputPath('--out', xlsx, [file], force);
  if (html !== undefined) checkOutputPath('--html', html, [file], force);
  const bins = args.flags.has('bins');
  if (bins && !args.flags.has('json')) throw new CutlineError('--bins adds the binned tables to the JSON document: use it with --json');
  const spec = parseCheckSpec(args);
  const reports = xlsx !== undefined || html !== undefined;
  // Without reports the file's table is let go before the check runs (peak memory).
  const c = await checkFile(file, spec, bins || reports, reports);
  if (args.flags.has('json')) process.stdout.write(JSON.stringify(toJson(bins ? c.result : withoutPlotData(c.result)), null, 2) + '\n');
  else process.stdout.write(readable(file, c.result));
  if (reports) {
    const { writeReports } = await import('./reportFiles');
    await writeReports(c.source!, c.result, spec.options, c.names, { xlsx, html });
    if (!args.flags.has('json')) process.stdout.write(`\nReports written: ${[xlsx, html].filter((p) => p !== undefined).join(', ')}\n`);
  }
  return 0;
}

async function main(argv: string[]): Promise<number> {
  try {
    if (argv.length === 0 || argv[0] === 'help' || argv[0] === '--help') {
      process.stdout.write(USAGE);
      return argv.length === 0 ? 2 : 0;
    }
    // `cutline check --help` (anywhere after the command) prints the usage too.
    if (argv[0] === 'check' && argv.slice(1).some((a) => a === '--help' || a === '-h')) {
      process.stdout.write(USAGE);
      return 0;
    }
    const args = parseArgs(argv);
    if (args.command !== 'check') throw new CutlineError(`unknown command ${JSON.stringify(args.command)}; the command is \`cutline check\``);
    return await check(args);
  } catch (e) {
    if (e instanceof CutlineError) {
      process.stderr.write(`cutline: ${errorLine(e)}\n`);
      return 2;
    }
    process.stderr.write(`cutline: internal error: ${e instanceof Error ? e.message : String(e)}\n`);
    return 1;
  }
}

if (!isMainThread && (workerData as { cutlineBatchWorker?: boolean } | null)?.cutlineBatchWorker) {
  void import('./batchWorker').then((w) => w.startBatchWorker());
} else {
  main(process.argv.slice(2)).then((code) => {
    // Exit once standard output has been flushed, without waiting for the heap of
    // a million-row check to be torn down.
    process.stdout.write('', () => process.exit(code));
  });
}
