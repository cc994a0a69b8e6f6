/**
 * The `mse` and `ik` bandwidth rules against the population MSE-optimal
 * bandwidth h* of closed-form designs (issue 13, item 4). h* comes from first
 * principles with SciPy (test/fixtures/bandwidth_population/make_population.py:
 * h* = [V_K·S/(B_K²Δ²)]^(1/5)·n^(−1/5), kernel integrals by quadrature, Δ and S
 * from the designs' closed forms); the designs are simulated by
 * test/helpers/bandwidthDesigns.ts. For each design, n and rule: the median of
 * ĥ/h* over the replications, with its Monte Carlo standard error (from the
 * density of ĥ/h* at the median, estimated by the spread of the central order
 * statistics: (q₀.₅₊ₐ − q₀.₅₋ₐ)/(2a)·sqrt(0.25/reps), a = 0.1), and the
 * interquartile range. Consistency shows as a median ratio moving to 1 and a
 * spread shrinking as n grows.
 * Run: node bin/run-ts.cjs bench/bandwidthConvergence.ts [reps]
 */
import { simulateDesign } from '../test/helpers/bandwidthDesigns';
import population from '../test/fixtures/bandwidth_population/population.json';
import { Random, chooseBandwidth } from '../src/engine';

const pop = population as { designs: { name: string; h_star: Record<string, number> }[] };
const reps = Number(process.argv[2] ?? 200);
const q = (s: number[], p: number): number => s[Math.min(s.length - 1, Math.max(0, Math.round(p * (s.length - 1))))];
const t0 = Date.now();
console.log(`bandwidth rules vs population h* (triangular kernel): median ĥ/h* (MC s.e.) [IQR], ${reps} replications`);
pop.designs.forEach((d, k) => {
  for (const rule of ['mse', 'ik'] as const) {
    const cells: string[] = [];
    for (const n of [1000, 4000, 16000, 64000]) {
      const rng = new Random(4000 + 10 * k + n);
      const ratios: number[] = [];
      for (let r = 0; r < reps; r++) {
        const s = simulateDesign(k, n, rng);
        ratios.push(chooseBandwidth(s.score, s.outcome, 0, { rule, kernel: 'triangular', treated: s.treated }).value / d.h_star[String(n)]);
      }
      ratios.sort((a, b) => a - b);
      const med = q(ratios, 0.5);
      const se = ((q(ratios, 0.6) - q(ratios, 0.4)) / 0.4) * Math.sqrt(0.25 / reps);
      cells.push(`n=${n}: ${med.toFixed(3)} (${se.toFixed(3)}) [${q(ratios, 0.25).toFixed(2)}, ${q(ratios, 0.75).toFixed(2)}]`);
    }
    console.log(`${d.name} — ${rule}\n   ${cells.join('; ')}`);
  }
});
console.log(`total ${((Date.now() - t0) / 1000).toFixed(0)} s`);
