/**
 * Speed of `cutline check FOLDER --out-dir DIR` (issue 12): files per second
 * writing both reports (workbook and HTML page) for a folder of generated
 * files, with one worker (--jobs 1) and with as many as the machine has
 * cores, and the speed-up of the second over the first. The machine's load
 * (other processes on its cores) limits the speed-up: the figure printed is
 * what this machine gave at this moment.
 * Run: node bin/run-ts.cjs bench/batchBench.ts [files] [rows]
 */
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';

const files = Number(process.argv[2] ?? 16);
const rows = Number(process.argv[3] ?? 2000);
const cli = path.join(process.cwd(), 'bin/cutline.cjs');

/** A fuzzy design with a seeded linear congruential stream (file k shifts the seed). */
function csv(k: number): string {
  let s = (k * 2654435761) >>> 0;
  const u = (): number => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296);
  const lines = ['score,treated,bill,age'];
  for (let i = 0; i < rows; i++) {
    const r = u() * 2 - 1;
    const d = u() < (r >= 0 ? 0.7 : 0.2) ? 1 : 0;
    lines.push(`${r.toFixed(5)},${d},${(1 + r + 2 * d + (u() - 0.5)).toFixed(5)},${30 + Math.floor(u() * 40)}`);
  }
  return lines.join('\n') + '\n';
}

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-batch-bench-'));
const input = path.join(dir, 'in');
fs.mkdirSync(input);
for (let k = 0; k < files; k++) fs.writeFileSync(path.join(input, `file${k}.csv`), csv(k));

/** Wall and CPU seconds (user + system, all threads) of one batch run, by /usr/bin/time. */
function run(jobs: number): { seconds: number; cpu: number } {
  const out = path.join(dir, `out${jobs}`);
  const args = ['-f', '%e %U %S', process.execPath, cli, 'check', input, '--score', 'score', '--treated', 'treated', '--outcome', 'bill', '--covariate', 'age', '--cutoff', '0', '--out-dir', out, '--jobs', String(jobs)];
  const r = spawnSync('/usr/bin/time', args, { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`cutline failed: ${r.stderr}`);
  const [seconds, user, sys] = r.stderr.trim().split('\n').pop()!.split(' ').map(Number);
  return { seconds, cpu: user + sys };
}

const cores = typeof os.availableParallelism === 'function' ? os.availableParallelism() : os.cpus().length;
process.stdout.write(`\nbatch reports (xlsx + html), ${files} files of ${rows} rows, 999 draws; ${cores} cores; load average ${os.loadavg()[0].toFixed(1)}\n`);
const one = run(1);
process.stdout.write(`  --jobs 1:  ${one.seconds.toFixed(1)} s wall, ${one.cpu.toFixed(1)} s CPU, ${(files / one.seconds).toFixed(2)} files/s\n`);
const many = run(cores);
process.stdout.write(`  --jobs ${cores}:  ${many.seconds.toFixed(1)} s wall, ${many.cpu.toFixed(1)} s CPU, ${(files / many.seconds).toFixed(2)} files/s\n`);
process.stdout.write(`  speed-up over one worker: ${(one.seconds / many.seconds).toFixed(2)}× (CPU used per wall second: ${(one.cpu / one.seconds).toFixed(2)} and ${(many.cpu / many.seconds).toFixed(2)})\n`);
fs.rmSync(dir, { recursive: true, force: true });
