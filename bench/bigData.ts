/**
 * Seeded synthetic fuzzy designs written as CSV for the benchmarks: score
 * N(0,1), cutoff 0, complier effect 0.5, continuous outcome. `linear`: take-up
 * 0.2 → 0.7 flat and a straight outcome line — the worst case for speed, as
 * every bandwidth rule then spreads its window over most of the data.
 * `curved`: take-up and outcome bend with the score, as real designs do.
 */
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { Random } from '../src/engine';

export type Shape = 'linear' | 'curved';

export function bigCsvPath(n: number, seed = 7, shape: Shape = 'linear'): string {
  const file = path.join(os.tmpdir(), `cutline-bench-${n}-${seed}${shape === 'linear' ? '' : '-' + shape}.csv`);
  if (fs.existsSync(file)) return file;
  const rng = new Random(seed);
  const parts: string[] = ['score,treated,outcome,age\n'];
  for (let i = 0; i < n; i++) {
    const r = rng.normal();
    const curved = shape === 'curved';
    const p = curved ? Math.min(0.95, Math.max(0.02, (r >= 0 ? 0.6 : 0.2) + 0.15 * r - 0.08 * r * r)) : r >= 0 ? 0.7 : 0.2;
    const d = rng.uniform() < p ? 1 : 0;
    const y = 1 + r + (curved ? 0.8 * r * r - 0.3 * r * r * r : 0) + 0.5 * d + rng.normal();
    parts.push(`${r.toFixed(6)},${d},${y.toFixed(6)},${Math.floor(20 + 40 * rng.uniform())}\n`);
  }
  fs.writeFileSync(file, parts.join(''));
  return file;
}
