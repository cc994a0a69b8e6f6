/**
 * Monte Carlo size and power of the validity test (docs/methods.md §4) at 5%,
 * on designs built here (score U(−1, 1), cutoff 0, every outcome plus 0.3·R so
 * that the local linear fits matter). Compliance types: always-takers (a),
 * never-takers (n), compliers (c), defiers (f).
 *
 * - slack: valid, a/n/c = 0.2/0.2/0.6, normal outcomes (restrictions slack);
 * - binding: valid, a/n/c = 0.25/0.25/0.5, compliers' Y(1) ~ U(0,1), Y(0) ~ U(−1,0)
 *   while a/n outcomes spread wide: every interval outside the band binds;
 * - defiers: a/n/c/f = 0.2/0.2/0.45/0.15, defiers' Y(1) ~ N(2.5, 0.3²), Y(0) ~ N(−2.5, 0.3²);
 * - sorting: never-takers (Y ~ N(2.5, 0.5²)) sort above: n share 0.2 below, 0.32 above (compliers 0.6 → 0.48);
 * - nearly sharp: the same sorting with a/n/c 0.01/0.03/0.96 below, 0.01/0.05/0.94 above (take-up jump 0.94).
 *
 * Bandwidth h = 0.6·(n/2000)^(−1/4) (undersmoothed relative to n^(−1/5)),
 * triangular kernel, grid 30, trim 0.1, normal multipliers, the default 999
 * draws (seed = replication number), 1000 replications per cell (about 2 minutes on one core).
 * Run: node bin/run-ts.cjs bench/validityMonteCarlo.ts [reps]
 */
import { Random, validityTest } from '../src/engine';

type Shares = [number, number, number, number]; // a, n, c, f
interface Design {
  name: string;
  below: Shares;
  above: Shares;
  y: (type: number, d: number, rng: Random) => number;
}

const normalY = (t: number, d: number, rng: Random): number => (t === 0 ? 1 : t === 1 ? -0.5 : d ? 1 : 0) + rng.normal();
const sortY = (t: number, d: number, rng: Random): number =>
  t === 1 ? 2.5 + 0.5 * rng.normal() : t === 0 ? 1 + rng.normal() : d ? 1 + rng.normal() : rng.normal();

const designs: Design[] = [
  { name: 'valid, slack', below: [0.2, 0.2, 0.6, 0], above: [0.2, 0.2, 0.6, 0], y: normalY },
  {
    name: 'valid, binding',
    below: [0.25, 0.25, 0.5, 0],
    above: [0.25, 0.25, 0.5, 0],
    y: (t, d, rng) => (t === 2 ? (d ? rng.uniform() : -rng.uniform()) : 1.5 * rng.normal()),
  },
  {
    name: 'defiers',
    below: [0.2, 0.2, 0.45, 0.15],
    above: [0.2, 0.2, 0.45, 0.15],
    y: (t, d, rng) => (t === 3 ? (d ? 2.5 : -2.5) + 0.3 * rng.normal() : rng.normal()),
  },
  { name: 'sorting (never-takers)', below: [0.2, 0.2, 0.6, 0], above: [0.2, 0.32, 0.48, 0], y: sortY },
  { name: 'nearly sharp + sorting', below: [0.01, 0.03, 0.96, 0], above: [0.01, 0.05, 0.94, 0], y: sortY },
];

function simulate(d: Design, n: number, rng: Random) {
  const score = new Float64Array(n), treated = new Float64Array(n), outcome = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = 2 * rng.uniform() - 1;
    const sh = r >= 0 ? d.above : d.below;
    const u = rng.uniform();
    const t = u < sh[0] ? 0 : u < sh[0] + sh[1] ? 1 : u < sh[0] + sh[1] + sh[2] ? 2 : 3;
    const above = r >= 0 ? 1 : 0;
    const dd = t === 0 ? 1 : t === 1 ? 0 : t === 2 ? above : 1 - above;
    score[i] = r;
    treated[i] = dd;
    outcome[i] = d.y(t, dd, rng) + 0.3 * r;
  }
  return { score, treated, outcome };
}

const reps = Number(process.argv[2] ?? 1000);
const t0 = Date.now();
console.log(`validity test Monte Carlo: rejection rate at 5% (MC s.e.), ${reps} replications, 999 normal draws`);
for (const d of designs) {
  const cells: string[] = [];
  for (const n of [2000, 10000]) {
    const rng = new Random(20240 + n);
    const h = 0.6 * Math.pow(n / 2000, -0.25);
    let rej = 0, takeup = 0;
    for (let r = 0; r < reps; r++) {
      const s = simulate(d, n, rng);
      const v = validityTest(s.score, s.treated, s.outcome, 0, { bandwidth: h, kernel: 'triangular', draws: 999, seed: r + 1 });
      if (v.pvalue <= 0.05) rej++;
      takeup += v.takeup;
    }
    const p = rej / reps;
    cells.push(`n=${n} (h=${h.toFixed(3)}): ${p.toFixed(3)} (${Math.sqrt((p * (1 - p)) / reps).toFixed(3)}), mean take-up jump ${(takeup / reps).toFixed(2)}`);
  }
  console.log(`${d.name.padEnd(24)} ${cells.join('; ')}`);
}
console.log(`total ${((Date.now() - t0) / 1000).toFixed(0)} s`);
