/**
 * Timing of every check of issue 4 on 1,000,000 rows (target: under 1 s in
 * total): McCrary, the local polynomial density test, one covariate's jump
 * (boundaryWindow + jumpAt at a fixed bandwidth) with its permutation test,
 * and the binned means. Prints figures; asserts nothing.
 * Run: node bin/run-ts.cjs bench/densityBench.ts
 */
import { Random, binnedMeans, boundaryWindow, jumpAt, localPolynomialDensityTest, mccraryTest, permutationBalanceTest } from '../src/engine';

const n = 1_000_000;
const rng = new Random(2024);
const score = new Float64Array(n);
const age = new Float64Array(n);
for (let i = 0; i < n; i++) {
  score[i] = 60 + 10 * rng.normal();
  age[i] = 40 + 0.5 * (score[i] - 60) + 8 * rng.normal();
}
const cutoff = 60;
const h = 5; // a fixed covariate bandwidth: the bandwidth rule is timed by the lead's benches

function time<T>(label: string, f: () => T): { ms: number; out: T } {
  const t0 = performance.now();
  const out = f();
  const ms = performance.now() - t0;
  console.log(`${label.padEnd(44)} ${ms.toFixed(1).padStart(8)} ms`);
  return { ms, out };
}

for (const pass of [1, 2]) {
  console.log(`\n— pass ${pass} (${n.toLocaleString('en')} rows) —`);
  const parts = [
    time('McCrary density test', () => mccraryTest(score, cutoff)),
    time('local polynomial density test', () => localPolynomialDensityTest(score, cutoff)),
    time('covariate jump (window + jumpAt, neighbours)', () => jumpAt(boundaryWindow(score, cutoff, h, 'triangular'), age, { variance: 'neighbours' })),
    time('covariate permutation test (999 draws)', () => permutationBalanceTest(score, age, cutoff)),
    time('binned means (IMSE count)', () => binnedMeans(score, age, cutoff)),
  ];
  const total = parts.reduce((s, p) => s + p.ms, 0);
  console.log(`${'total'.padEnd(44)} ${total.toFixed(1).padStart(8)} ms`);
  if (pass === 2) {
    const [m, lp, j, perm, bins] = parts.map((p) => p.out) as [any, any, any, any, any];
    console.log(`\nMcCrary: log ratio ${m.log_ratio.toFixed(4)} se ${m.se.toFixed(4)} p ${m.pvalue.toFixed(3)} bin ${m.bin.toPrecision(4)} h ${m.bandwidth.toFixed(3)}`);
    console.log(`local polynomial: log ratio ${lp.log_ratio.toFixed(4)} se ${lp.se.toFixed(4)} p ${lp.pvalue.toFixed(3)} h ${lp.bandwidth.toFixed(3)} (units ${lp.units_below}/${lp.units_above})`);
    console.log(`covariate jump: ${j.estimate.toFixed(4)} (robust p ${j.pvalue.toFixed(3)}); permutation: q ${perm.q}, p ${perm.pvalue.toFixed(3)}`);
    console.log(`bins: ${bins.binsBelow} below, ${bins.binsAbove} above`);
  }
}
