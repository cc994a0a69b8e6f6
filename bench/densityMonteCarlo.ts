/**
 * Monte Carlo of the issue-4 checks (prints figures; asserts nothing):
 * size of both density tests on densities continuous at the cutoff, power
 * against a known jump, coverage of the local polynomial density intervals on
 * known densities, and size/power of the Canay–Kamat permutation test.
 * Nominal level 5%; MC standard errors sqrt(p(1−p)/reps).
 * Run: node bin/run-ts.cjs bench/densityMonteCarlo.ts [reps]
 */
import { Random, localPolynomialDensityTest, mccraryTest, permutationBalanceTest } from '../src/engine';

const reps = Number(process.argv[2] ?? 2000);
const fmt = (k: number, r: number) => {
  const p = k / r;
  return `${(100 * p).toFixed(1).padStart(5)}% ± ${(100 * Math.sqrt((p * (1 - p)) / r)).toFixed(1)}`;
};

/** R = ±Y, Y ~ Beta(1,3): f₋(0) = 3pb, f₊(0) = 3(1 − pb). */
function betaMixture(rng: Random, n: number, pb: number): Float64Array {
  const r = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const y = 1 - Math.cbrt(rng.uniform());
    r[i] = rng.uniform() < pb ? -y : y;
  }
  return r;
}
function normals(rng: Random, n: number): Float64Array {
  const r = new Float64Array(n);
  for (let i = 0; i < n; i++) r[i] = rng.normal();
  return r;
}

interface Design {
  name: string;
  draw: (rng: Random, n: number) => Float64Array;
  cutoff: number;
  fAbove: number;
  fBelow: number;
}
const phi = (x: number) => Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
const designs: Design[] = [
  { name: 'N(0,1), c = 0.3 (smooth)', draw: normals, cutoff: 0.3, fAbove: phi(0.3), fBelow: phi(0.3) },
  { name: 'Beta mixture pb = 0.5 (continuous, kinked)', draw: (g, n) => betaMixture(g, n, 0.5), cutoff: 0, fAbove: 1.5, fBelow: 1.5 },
  { name: 'Beta mixture pb = 0.45 (ln ratio 0.201)', draw: (g, n) => betaMixture(g, n, 0.45), cutoff: 0, fAbove: 1.65, fBelow: 1.35 },
  { name: 'Beta mixture pb = 0.4 (ln ratio 0.405)', draw: (g, n) => betaMixture(g, n, 0.4), cutoff: 0, fAbove: 1.8, fBelow: 1.2 },
];

const t0 = performance.now();
console.log(`Density tests, ${reps} replications each; rejection rate at 5% (± MC s.e.)`);
console.log('design'.padEnd(44), 'n'.padStart(6), 'McCrary'.padStart(15), 'local poly'.padStart(15), 'LP cover f+'.padStart(15), 'LP cover f-'.padStart(15), 'errors');
for (const d of designs) {
  for (const n of [1000, 5000]) {
    const rng = new Random(1000 + n);
    let mc = 0;
    let lp = 0;
    let covA = 0;
    let covB = 0;
    let errors = 0;
    let done = 0;
    for (let r = 0; r < reps; r++) {
      const x = d.draw(rng, n);
      try {
        if (mccraryTest(x, d.cutoff).pvalue < 0.05) mc++;
        const l = localPolynomialDensityTest(x, d.cutoff);
        if (l.pvalue < 0.05) lp++;
        if (l.ci_above[0] <= d.fAbove && d.fAbove <= l.ci_above[1]) covA++;
        if (l.ci_below[0] <= d.fBelow && d.fBelow <= l.ci_below[1]) covB++;
        done++;
      } catch {
        errors++;
      }
    }
    console.log(d.name.padEnd(44), String(n).padStart(6), fmt(mc, done).padStart(15), fmt(lp, done).padStart(15), fmt(covA, done).padStart(15), fmt(covB, done).padStart(15), errors);
  }
}

const permReps = Math.round(reps / 2);
console.log(`\nPermutation test (Canay & Kamat), ${permReps} replications, 199 permutations, rule-of-thumb q; rejection at 5%`);
const covDesigns = [
  { name: 'W = 0.5R + N(0,1), continuous at c (size)', w: (g: Random, r: number) => 0.5 * r + g.normal() },
  { name: 'W = 1{N(0,1) < 0.8R}, binary (size)', w: (g: Random, r: number) => (g.normal() < 0.8 * r ? 1 : 0) },
  { name: 'W = 0.5R + N(0,1) + 0.5·1{R ≥ c} (power)', w: (g: Random, r: number) => 0.5 * r + g.normal() + (r >= 0 ? 0.5 : 0) },
  { name: 'W ~ N(0, (1 + 1{R ≥ c})²): scale jump (power)', w: (g: Random, r: number) => g.normal() * (r >= 0 ? 2 : 1) },
];
for (const d of covDesigns) {
  for (const n of [1000, 5000]) {
    const rng = new Random(7000 + n);
    let rej = 0;
    let qsum = 0;
    for (let k = 0; k < permReps; k++) {
      const r = normals(rng, n);
      const w = new Float64Array(n);
      for (let i = 0; i < n; i++) w[i] = d.w(rng, r[i]);
      const res = permutationBalanceTest(r, w, 0, { permutations: 199, seed: k + 1 });
      qsum += res.q;
      if (res.pvalue <= 0.05) rej++;
    }
    console.log(d.name.padEnd(48), String(n).padStart(6), `mean q ${(qsum / permReps).toFixed(1)}`.padStart(12), fmt(rej, permReps).padStart(15));
  }
}
console.log(`\nelapsed ${((performance.now() - t0) / 1000).toFixed(1)} s`);
