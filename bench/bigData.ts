/**
 * Seeded synthetic fuzzy designs written as CSV for the benchmarks: score
 * N(0,1), cutoff 0, take-up 0.2 → 0.7, complier effect 0.5, continuous outcome.
 */
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { Random } from '../src/engine/random';

export function bigCsvPath(n: number, seed = 7): string {
  const file = path.join(os.tmpdir(), `cutline-bench-${n}-${seed}.csv`);
  if (fs.existsSync(file)) return file;
  const rng = new Random(seed);
  const parts: string[] = ['score,treated,outcome,age\n'];
  for (let i = 0; i < n; i++) {
    const r = rng.normal();
    const d = rng.uniform() < (r >= 0 ? 0.7 : 0.2) ? 1 : 0;
    const y = 1 + r + 0.5 * d + rng.normal();
    parts.push(`${r.toFixed(6)},${d},${y.toFixed(6)},${Math.floor(20 + 40 * rng.uniform())}\n`);
  }
  fs.writeFileSync(file, parts.join(''));
  return file;
}
