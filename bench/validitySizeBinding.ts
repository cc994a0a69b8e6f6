/**
 * Monte Carlo size of the validity test (the published version: observed
 * outcomes) at nulls where the restrictions BIND — where the moment selection
 * of Andrews & Shi (2013) matters most — for continuous, binary and discrete
 * outcomes, n = 1000, 3000, 10000 (issue 13, item 5). Score U(−1, 1), cutoff 0;
 * type shares constant in the score and outcomes free of it, so the local
 * linear fits are unbiased and only the inference is on trial. Types:
 * always-takers (a), never-takers (n), compliers (c).
 *
 * - continuous: a/n/c = 0.25/0.25/0.5, Y(1) of compliers ~ U(0, 1), Y(0) ~ U(−1, 0),
 *   a and n ~ N(0, 1.5²): every arm-1 interval outside [0, 1] (and arm-0 outside
 *   [−1, 0]) has ν = 0;
 * - binary: a/n/c = 0.3/0.3/0.4, compliers Y(1) = 1, Y(0) = 0, a and n Bernoulli(1/2):
 *   ν({0}, 1) = ν({1}, 0) = 0;
 * - discrete: values 0..6, compliers Y(1) uniform on {4, 5}, Y(0) on {1, 2}, a and n
 *   uniform on 0..6: every interval outside the compliers' values binds;
 * - no compliers: a/n = 0.5/0.5 on both sides, Y ~ N(0, 1): every moment binds
 *   (the least favourable null; take-up does not jump).
 *
 * Bandwidth h = 0.6·(n/2000)^(−1/4), triangular kernel, grid 30, trim 0.1,
 * normal multipliers, 999 draws, seed = replication number. Reported: rejection
 * rate at 5% with its Monte Carlo standard error sqrt(p(1−p)/reps).
 * Run: node bin/run-ts.cjs bench/validitySizeBinding.ts [reps]
 */
import { Random, validityTest } from '../src/engine';

interface Design {
  name: string;
  shares: [number, number, number]; // a, n, c (both sides)
  y: (type: number, d: number, rng: Random) => number;
}

const designs: Design[] = [
  { name: 'continuous, binding', shares: [0.25, 0.25, 0.5], y: (t, d, rng) => (t === 2 ? (d ? rng.uniform() : -rng.uniform()) : 1.5 * rng.normal()) },
  { name: 'binary, binding', shares: [0.3, 0.3, 0.4], y: (t, d, rng) => (t === 2 ? d : rng.uniform() < 0.5 ? 1 : 0) },
  { name: 'discrete, binding', shares: [0.25, 0.25, 0.5], y: (t, d, rng) => (t === 2 ? (d ? 4 : 1) + rng.integer(2) : rng.integer(7)) },
  { name: 'no compliers (all bind)', shares: [0.5, 0.5, 0], y: (_t, _d, rng) => rng.normal() },
];

function simulate(d: Design, n: number, rng: Random) {
  const score = new Float64Array(n), treated = new Float64Array(n), outcome = new Float64Array(n);
  const [a, nt] = d.shares;
  for (let i = 0; i < n; i++) {
    const r = 2 * rng.uniform() - 1;
    const u = rng.uniform();
    const t = u < a ? 0 : u < a + nt ? 1 : 2;
    const dd = t === 0 ? 1 : t === 1 ? 0 : r >= 0 ? 1 : 0;
    score[i] = r;
    treated[i] = dd;
    outcome[i] = d.y(t, dd, rng);
  }
  return { score, treated, outcome };
}

const reps = Number(process.argv[2] ?? 1000);
const t0 = Date.now();
console.log(`validity test size at binding nulls: rejection rate at 5% (MC s.e.), ${reps} replications, 999 normal draws`);
for (const d of designs) {
  const cells: string[] = [];
  for (const n of [1000, 3000, 10000]) {
    const rng = new Random(1313 + n);
    const h = 0.6 * Math.pow(n / 2000, -0.25);
    let rej = 0;
    for (let r = 0; r < reps; r++) {
      const s = simulate(d, n, rng);
      const v = validityTest(s.score, s.treated, s.outcome, 0, { bandwidth: h, kernel: 'triangular', draws: 999, seed: r + 1 });
      // Every design here has units of both kinds on both sides, so the test always applies (docs/methods.md §4.7).
      if (v.applicable && v.pvalue <= 0.05) rej++;
    }
    const p = rej / reps;
    cells.push(`n=${n}: ${p.toFixed(3)} (${Math.sqrt((p * (1 - p)) / reps).toFixed(3)})`);
  }
  console.log(`${d.name.padEnd(26)} ${cells.join('; ')}`);
}
console.log(`total ${((Date.now() - t0) / 1000).toFixed(0)} s`);
