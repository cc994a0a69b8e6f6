import { performance } from 'perf_hooks';
import { hashCells } from '../src/functions/cache';
import { Random } from '../src/engine/numeric/random';
const N = 100000;
const rng = new Random(3);
const a: unknown[][] = [['s']], b: unknown[][] = [['t']], c: unknown[][] = [['y']];
for (let i = 0; i < N; i++) { const r = rng.normal(); a.push([Number(r.toFixed(6))]); b.push([rng.uniform() < (r>0?0.7:0.2)]); c.push([i % 5000 === 17 ? '' : 1 + r + rng.normal()]); }
const copy = (x: unknown[][]) => x.map((r) => [...r]);
const best = [1e9, 1e9, 1e9];
for (let k = 0; k < 30; k++) {
  const xs = [copy(a), copy(b), copy(c)];
  xs.forEach((x, j) => { const t = performance.now(); hashCells(x); best[j] = Math.min(best[j], performance.now() - t); });
}
console.log('score', best[0].toFixed(2), 'treated(bool)', best[1].toFixed(2), 'outcome', best[2].toFixed(2));
