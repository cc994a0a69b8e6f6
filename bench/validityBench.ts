/**
 * Timings of the validity test (docs/methods.md §4): the whole test and the
 * bootstrap alone, at 1e5 and 1e6 rows, 999 normal draws, grid 30, and the
 * Rademacher bootstrap for comparison, and the guarded report (both
 * versions, docs/methods.md §4.8); peak RSS at the end.
 * Run: node bin/run-ts.cjs bench/validityBench.ts
 */
import { Random, bootstrapMaxima, resolveValidityOptions, selection, validityMomentSets, validityReport, validityTest } from '../src/engine';

function data(n: number, seed: number) {
  const rng = new Random(seed);
  const score = new Float64Array(n), treated = new Float64Array(n), outcome = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = 2 * rng.uniform() - 1;
    const d = rng.uniform() < (r >= 0 ? 0.7 : 0.2) ? 1 : 0;
    score[i] = r;
    treated[i] = d;
    outcome[i] = 1 + 0.5 * r + d + rng.normal();
  }
  return { score, treated, outcome };
}

function best(f: () => void, reps: number): number {
  let m = Infinity;
  for (let r = 0; r < reps; r++) {
    const t0 = process.hrtime.bigint();
    f();
    m = Math.min(m, Number(process.hrtime.bigint() - t0) / 1e6);
  }
  return m;
}

const h = 0.3; // about 30% of the rows in the window
for (const n of [100_000, 1_000_000]) {
  const d = data(n, 1);
  const opts = { bandwidth: h, kernel: 'triangular' as const };
  const r = validityTest(d.score, d.treated, d.outcome, 0, opts);
  if (!r.applicable) throw new Error(r.reason);
  const whole = best(() => validityTest(d.score, d.treated, d.outcome, 0, opts), 5);
  // The check's headline: both versions (trend guard on) at one bandwidth, the trend fit included.
  const guarded = best(() => validityReport(d.score, d.treated, d.outcome, 0, opts), 3);
  const ro = resolveValidityOptions(opts);
  const sets = validityMomentSets(d.score, d.treated, d.outcome, 0, opts, ro).windows.map((w) => w.set!);
  const kappa = Math.sqrt(0.3 * Math.log(n));
  const bn = Math.sqrt((0.4 * Math.log(n)) / Math.log(Math.log(n)));
  const phis = sets.map((m) => selection(m, kappa, bn));
  const boot = best(() => bootstrapMaxima(sets, phis, 999, 1, 'normal'), 5);
  const rad = best(() => bootstrapMaxima(sets, phis, 999, 1, 'rademacher'), 1);
  console.log(
    `n=${n}: window ${r.counts.below}+${r.counts.above}, ${r.intervals} intervals; ` +
      `validity test (999 normal draws) ${whole.toFixed(1)} ms; with the trend guard (both versions) ${guarded.toFixed(1)} ms; normal bootstrap alone ${boot.toFixed(1)} ms; ` +
      `Rademacher bootstrap alone ${rad.toFixed(0)} ms; p = ${r.pvalue.toFixed(3)}`,
  );
}
console.log(`peak RSS ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
