/**
 * Speed of `cutline check` (issue 2: estimates on 1,000,000 rows in under 2 s
 * end to end, linear in the rows): wall time of the real command on seeded
 * CSV files of growing size, and the in-process split into phases.
 * Run: node bin/run-ts.cjs bench/checkBench.ts
 */
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as path from 'path';
import { runCheck } from '../src/engine/check';
import { numericColumn } from '../src/input/columns';
import { parseCsv } from '../src/input/csv';
import { bigCsvPath } from './bigData';

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

export function checkBench(extra: string[] = ['--sensitivity', 'off'], label = 'estimates + checks'): void {
  process.stdout.write(`\ncutline check end to end (${label}; best of 3; wall seconds, peak memory)\n`);
  for (const n of [250_000, 500_000, 1_000_000]) {
    const file = bigCsvPath(n);
    const r = best(3, () => wall(file, extra));
    process.stdout.write(`  ${String(n).padStart(9)} rows: ${r.seconds.toFixed(2)} s, ${r.peakMb.toFixed(0)} MB, ${((r.seconds / n) * 1e6).toFixed(2)} µs/row\n`);
  }
  const file = bigCsvPath(1_000_000);
  let t = performance.now();
  const text = fs.readFileSync(file, 'utf8');
  const tRead = performance.now() - t;
  t = performance.now();
  const table = parseCsv(text);
  const tParse = performance.now() - t;
  t = performance.now();
  const input = {
    score: numericColumn(table, 'score', 'score'),
    treated: numericColumn(table, 'treated', 'treated'),
    outcomes: [numericColumn(table, 'outcome', 'outcome')],
  };
  const tCols = performance.now() - t;
  t = performance.now();
  runCheck(input, { cutoff: 0 });
  const tCheck = performance.now() - t;
  process.stdout.write(
    `  phases at 1,000,000 rows (in process): read ${tRead.toFixed(0)} ms, scan ${tParse.toFixed(0)} ms, ` +
      `columns ${tCols.toFixed(0)} ms, runCheck ${tCheck.toFixed(0)} ms\n`,
  );
}

if (process.argv[1] && process.argv[1].endsWith('checkBench.ts')) checkBench([], 'estimates');
