/**
 * Speed of the nearest-neighbour residuals on tied scores (issue 9): the
 * residuals of one side of 1,000,000 units, and the whole estimates (take-up,
 * jump, effect with nn standard errors at a typed bandwidth) on 1,000,000
 * rows, for continuous scores and for scores with ties of every size. The
 * grouped computation of src/engine/fit/residuals.ts should take about the
 * same time whatever the ties (before issue 9: 84 s for whole-number scores,
 * a minute for 100,000 rows of one repeated score).
 * Run: node bin/run-ts.cjs bench/tiesBench.ts
 */
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { estimatesAtCutoff, neighbourResiduals } from '../src/engine';

let seed = 20261202;
function rand(): number {
  seed = (seed * 1103515245 + 12345) % 2147483648;
  return seed / 2147483648;
}

const N = 1_000_000;
const designs: Array<[string, () => number]> = [
  ['continuous scores', () => rand() * 100],
  ['whole-number scores 0–99', () => Math.floor(rand() * 100)],
  ['one repeated score', () => 50],
  ['ten score values', () => Math.floor(rand() * 10) * 10],
  ['half one score, half continuous', () => (rand() < 0.5 ? 50 : rand() * 100)],
  ['scores rounded to 0.01', () => Math.round(rand() * 10000) / 100],
];

function best(k: number, f: () => void): number {
  let b = Infinity;
  for (let i = 0; i < k; i++) {
    const t = performance.now();
    f();
    b = Math.min(b, performance.now() - t);
  }
  return b;
}

process.stdout.write(`nn residuals of one side of ${N.toLocaleString('en')} units (best of 3, ms)\n`);
const times: number[] = [];
for (const [name, draw] of designs) {
  const x = Float64Array.from({ length: N }, draw).sort();
  const v = Float64Array.from({ length: N }, () => rand());
  const index = Int32Array.from({ length: N }, (_, i) => i);
  // A fresh side object each run: the residuals are remembered per side.
  const ms = best(3, () => neighbourResiduals({ index, x }, v));
  times.push(ms);
  process.stdout.write(`  ${name.padEnd(34)} ${ms.toFixed(0).padStart(6)} ms  (${(ms / times[0]).toFixed(2)} × continuous)\n`);
}

process.stdout.write(`\nestimates (take-up, jump, effect; nn variance, bandwidth 60) on ${N.toLocaleString('en')} rows, cutoff 50 (best of 3, ms)\n`);
const est: number[] = [];
for (const [name, draw] of designs) {
  if (name === 'one repeated score') continue; // one score: no discontinuity to fit
  const score = Float64Array.from({ length: N }, draw);
  const treated = Float64Array.from(score, (s) => (rand() < (s >= 50 ? 0.8 : 0.2) ? 1 : 0));
  const outcome = Float64Array.from(score, (s, i) => 0.02 * s + 2 * treated[i] + rand());
  const ms = best(3, () => {
    const opts = { bandwidth: 60, kernel: 'triangular' as const, variance: 'neighbours' as const, sign: 1 as const };
    const tk = estimatesAtCutoff(Float64Array.from(score), treated, treated, 50, opts);
    estimatesAtCutoff(score, treated, outcome, 50, { ...opts, window: tk.window, takeup: tk.smoothedTakeup });
  });
  est.push(ms);
  process.stdout.write(`  ${name.padEnd(34)} ${ms.toFixed(0).padStart(6)} ms  (${(ms / est[0]).toFixed(2)} × continuous)\n`);
}

/**
 * The whole `cutline check` (all checks, --sensitivity off) on 1,000,000 rows
 * written to CSV, continuous against whole-number scores: wall seconds of the
 * built command, best of 2.
 */
function csvFile(name: string, draw: () => number): string {
  const file = path.join(os.tmpdir(), `cutline-ties-${name}.csv`);
  if (fs.existsSync(file)) return file;
  const parts: string[] = ['score,treated,outcome\n'];
  for (let i = 0; i < N; i++) {
    const s = draw();
    const d = rand() < (s >= 50 ? 0.7 : 0.2) ? 1 : 0;
    parts.push(`${s},${d},${(0.02 * s + 0.5 * d + rand()).toFixed(5)}\n`);
  }
  fs.writeFileSync(file, parts.join(''));
  return file;
}

const cli = path.join(process.cwd(), 'bin', 'cutline.cjs');
process.stdout.write(`\ncutline check end to end on ${N.toLocaleString('en')} rows, cutoff 50, --sensitivity off (best of 2, wall s)\n`);
let wall0 = 0;
for (const [name, draw] of [
  ['continuous', () => Math.round(rand() * 1e6) / 1e4],
  ['whole-numbers', () => Math.floor(rand() * 100)],
] as Array<[string, () => number]>) {
  const file = csvFile(name, draw);
  let bestS = Infinity;
  for (let k = 0; k < 2; k++) {
    const t = performance.now();
    const r = spawnSync(process.execPath, [cli, 'check', file, '--score', 'score', '--treated', 'treated', '--outcome', 'outcome', '--cutoff', '50', '--sensitivity', 'off', '--json'], {
      encoding: 'utf8',
      maxBuffer: 1 << 26,
    });
    if (r.status !== 0) throw new Error(`cutline failed: ${r.stderr}`);
    bestS = Math.min(bestS, (performance.now() - t) / 1000);
  }
  if (wall0 === 0) wall0 = bestS;
  process.stdout.write(`  ${name.padEnd(34)} ${bestS.toFixed(2).padStart(6)} s  (${(bestS / wall0).toFixed(2)} × continuous)\n`);
}
