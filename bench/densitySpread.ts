/**
 * The density tests' standard errors against the Monte Carlo spread of their
 * estimates (issue 13, item 6), on closed-form densities continuous at the
 * cutoff: N(0, 1) with c = 0.3, and R = ±Y, Y ~ Beta(1, 3) with equal weights
 * (f₊(0) = f₋(0) = 1.5, a kink at 0).
 *
 * For each test, n and bandwidth (fixed, so that the se describes one
 * estimator; and the test's own automatic choice):
 * - sd of θ̂ = ln f̂₊ − ln f̂₋ over the replications, the mean reported se,
 *   their ratio mean(se)/sd(θ̂) with its Monte Carlo s.e. (delta method:
 *   ratio·sqrt(1/(2(R−1)) + var(se)/(R·mean(se)²)));
 * - local polynomial: also the sd of its robust z statistic (1 if its se is
 *   right) and the rejection rate at 5% (± MC s.e.).
 * Run: node bin/run-ts.cjs bench/densitySpread.ts [reps]
 */
import { Random, localPolynomialDensityTest, mccraryTest } from '../src/engine';

const reps = Number(process.argv[2] ?? 1000);
const mean = (a: number[]) => a.reduce((s, v) => s + v, 0) / a.length;
const sd = (a: number[]) => {
  const m = mean(a);
  return Math.sqrt(a.reduce((s, v) => s + (v - m) ** 2, 0) / (a.length - 1));
};
function ratioText(theta: number[], se: number[]): string {
  const s = sd(theta);
  const m = mean(se);
  const r = m / s;
  const e = r * Math.sqrt(1 / (2 * (theta.length - 1)) + sd(se) ** 2 / (se.length * m * m));
  return `sd(θ̂) ${s.toFixed(4)}, mean se ${m.toFixed(4)}, ratio ${r.toFixed(3)} (${e.toFixed(3)})`;
}

const designs = [
  {
    name: 'N(0,1), c = 0.3',
    cutoff: 0.3,
    draw: (g: Random, n: number) => Float64Array.from({ length: n }, () => g.normal()),
  },
  {
    name: '±Beta(1,3), c = 0',
    cutoff: 0,
    draw: (g: Random, n: number) =>
      Float64Array.from({ length: n }, () => {
        const y = 1 - Math.cbrt(g.uniform());
        return g.uniform() < 0.5 ? -y : y;
      }),
  },
];

const t0 = Date.now();
console.log(`density tests: se vs Monte Carlo spread, ${reps} replications`);
for (const d of designs) {
  for (const n of [1000, 5000, 20000]) {
    for (const fixed of [true, false]) {
      // fixed bandwidths ~ n^(−1/5) (McCrary) and n^(−1/7) (local quadratic density), scaled to the design
      const hMc = fixed ? 1.2 * Math.pow(n / 1000, -0.2) * (d.cutoff === 0 ? 0.5 : 1) : undefined;
      const hLp = fixed ? 1.0 * Math.pow(n / 1000, -1 / 7) * (d.cutoff === 0 ? 0.5 : 1) : undefined;
      const rng = new Random(606 + n + (fixed ? 1 : 0));
      const mc = { theta: [] as number[], se: [] as number[] };
      const lp = { theta: [] as number[], se: [] as number[], z: [] as number[], rej: 0 };
      for (let r = 0; r < reps; r++) {
        const x = d.draw(rng, n);
        const a = mccraryTest(x, d.cutoff, hMc === undefined ? {} : { bandwidth: hMc });
        mc.theta.push(a.log_ratio);
        mc.se.push(a.se);
        const b = localPolynomialDensityTest(x, d.cutoff, hLp === undefined ? {} : { bandwidth: hLp });
        lp.theta.push(b.log_ratio);
        lp.se.push(b.se);
        lp.z.push(b.statistic);
        if (b.pvalue <= 0.05) lp.rej++;
      }
      const p = lp.rej / reps;
      console.log(`${d.name}, n=${n}, ${fixed ? 'fixed h' : 'automatic h'}`);
      console.log(`   McCrary:    ${ratioText(mc.theta, mc.se)}`);
      console.log(
        `   local poly: ${ratioText(lp.theta, lp.se)}; sd(z) ${sd(lp.z).toFixed(3)} (${(sd(lp.z) / Math.sqrt(2 * (reps - 1))).toFixed(3)}), ` +
          `rejects ${p.toFixed(3)} (${Math.sqrt((p * (1 - p)) / reps).toFixed(3)})`,
      );
    }
  }
}
console.log(`total ${((Date.now() - t0) / 1000).toFixed(0)} s`);
