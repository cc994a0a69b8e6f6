/**
 * Speed of `cutline check`: wall time and peak memory of the real command on
 * seeded CSV files of growing size (linear in the rows?), and the in-process
 * split into phases at 1,000,000 rows. Targets: issue 2, the estimates on 1M
 * rows under 2 s end to end; issue 3, the whole check with --sensitivity off
 * (999 draws, 930 intervals) at most 1 s and under 500 MB; issue 8, the
 * whole check of 1M rows with --bandwidth 10 --sensitivity off at most 0.9 s
 * and under 300 MB (`issueEight`: wall, CPU time and peak memory of the
 * process, best of 5, with the load average of the shared machine beside it).
 * Run: node bin/run-ts.cjs bench/checkBench.ts
 */
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { numericColumn } from '../src/input/columns';
import { parseCsv } from '../src/input/csv';
import { bigCsvPath, Shape } from './bigData';
import { bandwidthMse, estimatesAtCutoff, runCheck } from '../src/engine';

const root = path.resolve(__dirname, '..', '..', '..');
const cli = fs.existsSync(path.join(process.cwd(), 'bin/cutline.cjs')) ? path.join(process.cwd(), 'bin/cutline.cjs') : path.join(root, 'bin/cutline.cjs');

function wall(file: string, extra: string[]): { seconds: number; peakMb: number } {
  const args = ['-f', '%e %M', process.execPath, cli, 'check', file, '--score', 'score', '--treated', 'treated', '--outcome', 'outcome', '--cutoff', '0', '--json', ...extra];
  const r = spawnSync('/usr/bin/time', args, { encoding: 'utf8', maxBuffer: 1 << 26 });
  if (r.status !== 0) throw new Error(`cutline failed: ${r.stderr}`);
  const [sec, kb] = r.stderr.trim().split('\n').pop()!.split(' ').map(Number);
  return { seconds: sec, peakMb: kb / 1024 };
}

function best<T extends { seconds: number }>(k: number, f: () => T): T {
  let b: T | null = null;
  for (let i = 0; i < k; i++) {
    const r = f();
    if (!b || r.seconds < b.seconds) b = r;
  }
  return b!;
}

export function checkBench(shape: Shape, extra: string[], label: string): void {
  process.stdout.write(`\ncutline check end to end, ${shape} design (${label}; best of 3; wall seconds, peak memory)\n`);
  for (const n of [250_000, 500_000, 1_000_000]) {
    const file = bigCsvPath(n, 7, shape);
    const r = best(3, () => wall(file, extra));
    process.stdout.write(`  ${String(n).padStart(9)} rows: ${r.seconds.toFixed(2)} s, ${r.peakMb.toFixed(0)} MB, ${((r.seconds / n) * 1e6).toFixed(2)} µs/row\n`);
  }
}

/** One run of the command: wall and CPU seconds (user + system), peak MB, and the 1-minute load average when it ended. */
function timed(file: string, extra: string[]): { seconds: number; cpu: number; peakMb: number; load: number } {
  const args = ['-f', '%e %U %S %M', process.execPath, cli, 'check', file, '--score', 'score', '--treated', 'treated', '--outcome', 'outcome', '--cutoff', '0', ...extra];
  const r = spawnSync('/usr/bin/time', args, { encoding: 'utf8', maxBuffer: 1 << 26 });
  if (r.status !== 0) throw new Error(`cutline failed: ${r.stderr}`);
  const [sec, user, sys, kb] = r.stderr.trim().split('\n').pop()!.split(' ').map(Number);
  return { seconds: sec, cpu: user + sys, peakMb: kb / 1024, load: os.loadavg()[0] };
}

/** Issue 8's figure: the whole check of 1M rows, --bandwidth 10 --sensitivity off (999 draws), as a process. */
export function issueEight(shape: Shape): void {
  const file = bigCsvPath(1_000_000, 7, shape);
  const runs = Array.from({ length: 5 }, () => timed(file, ['--bandwidth', '10', '--sensitivity', 'off']));
  const wallBest = runs.reduce((a, b) => (b.seconds < a.seconds ? b : a));
  const cpuBest = runs.reduce((a, b) => (b.cpu < a.cpu ? b : a));
  const peak = Math.max(...runs.map((r) => r.peakMb));
  process.stdout.write(
    `\nwhole check, 1,000,000 rows (${shape}), --bandwidth 10 --sensitivity off, best of 5: ` +
      `wall ${wallBest.seconds.toFixed(2)} s (load ${wallBest.load.toFixed(2)}), CPU ${cpuBest.cpu.toFixed(2)} s (load ${cpuBest.load.toFixed(2)}), ` +
      `peak memory at most ${peak.toFixed(0)} MB over the 5 runs\n`,
  );
}

/** In-process phases at 1M rows: reading, and the estimates (bandwidth + take-up + effect) alone. */
export function phases(shape: Shape): void {
  const file = bigCsvPath(1_000_000, 7, shape);
  let t = performance.now();
  const text = fs.readFileSync(file, 'utf8');
  const tRead = performance.now() - t;
  t = performance.now();
  const table = parseCsv(text);
  const tParse = performance.now() - t;
  t = performance.now();
  const score = numericColumn(table, 'score', 'score').values;
  const treated = numericColumn(table, 'treated', 'treated').values;
  const outcome = numericColumn(table, 'outcome', 'outcome').values;
  const tCols = performance.now() - t;
  t = performance.now();
  const h = bandwidthMse(score, outcome, 0, 'triangular', treated).bandwidth;
  const tBw = performance.now() - t;
  t = performance.now();
  const e = estimatesAtCutoff(score, treated, treated, 0, { bandwidth: h, kernel: 'triangular', variance: 'neighbours', sign: 1 });
  estimatesAtCutoff(score, treated, outcome, 0, { bandwidth: h, kernel: 'triangular', variance: 'neighbours', sign: 1, window: e.window, takeup: e.smoothedTakeup });
  const tEst = performance.now() - t;
  t = performance.now();
  runCheck({ score: { name: 'score', values: Float64Array.from(score) }, treated: { name: 'treated', values: treated }, outcomes: [{ name: 'outcome', values: outcome }] }, { cutoff: 0, sensitivity: [] });
  const tCheck = performance.now() - t;
  process.stdout.write(
    `  phases at 1,000,000 rows, ${shape} (in process, first run): read ${tRead.toFixed(0)} ms, scan ${tParse.toFixed(0)} ms, ` +
      `3 columns ${tCols.toFixed(0)} ms, mse bandwidth ${tBw.toFixed(0)} ms, estimates ${tEst.toFixed(0)} ms; ` +
      `whole runCheck (--sensitivity off) ${tCheck.toFixed(0)} ms\n`,
  );
}

if (process.argv[1] && process.argv[1].endsWith('checkBench.ts')) {
  issueEight('linear');
  for (const shape of ['curved', 'linear'] as const) {
    checkBench(shape, ['--sensitivity', 'off'], 'all checks, --sensitivity off');
    checkBench(shape, [], 'all checks, default sensitivity: 5 bandwidths');
    phases(shape);
  }
}
