/**
 * Monte Carlo size and power of the validity test (docs/methods.md §4.8) at 5%:
 * the published test (Arai, Hsu, Kitagawa, Mourifié & Wan 2022: the observed
 * version, `trendGuard: false`) and Cutline's guarded test (the headline:
 * the larger p-value of the observed and trend-removed versions), side by
 * side on the same samples and the same multipliers. Prints figures; asserts
 * nothing.
 *
 * Designs built here: score U(−1, 1), cutoff 0; compliance types
 * always-takers (a), never-takers (n), compliers (c), defiers (f) with the
 * shares given below and above the cutoff; e ~ N(0, 1).
 *
 * Valid (local continuity and monotonicity hold; the test should reject ≤ 5%):
 * "Steep" is 30R: 3 outcome units per score point on a score that spans 20
 * points, as with y = 3·score in the study that found the false alarms.
 * - sharp, steep trend: D = 1{R ≥ 0}, Y = 30R + e. Cutline: not applicable (no
 *   p-value, counted as no rejection); the published column is the paper's
 *   test with every moment kept (as Cutline ran it before the arms rule);
 * - fuzzy, steep trend: a/n/c 0.2/0.2/0.6, Y = 30R + D + e; and with noise sd 15;
 * - curved: a/n/c 0.2/0.2/0.6, Y = 20R² + D + e;
 * - curved, not a polynomial: Y = 2·exp(2R) + D + e;
 * - binding, common trend: a/n/c 0.25/0.25/0.5, compliers' Y(1) ~ U(0, 1),
 *   Y(0) ~ U(−1, 0), a and n outcomes 1.5e (every interval outside the
 *   compliers' band binds), all plus 3R;
 * - binding, types on different trends: the same with a outcomes + 3R,
 *   n outcomes − 3R, compliers flat;
 * - slack (the older study's design): Y by type plus 0.3R;
 * - binary: Y = 1{2R + D + e > 0} (the guard does not apply);
 * - discrete, few values: Y = min(9, max(0, round(4 + 3R + D + 1.5e)));
 * - discrete, many values: Y = round(30R + D + 3e) (the guard applies).
 * Violations (power):
 * - defiers: a/n/c/f 0.2/0.2/0.45/0.15, defiers' Y(1) ~ N(2.5, 0.3²),
 *   Y(0) ~ N(−2.5, 0.3²), others e, all plus 0.3R;
 * - sorting of one type: never-takers (Y ~ N(2.5, 0.5²)) sort above: n share
 *   0.2 below, 0.32 above (compliers 0.6 → 0.48), plus 0.3R;
 * - sorting, steep trend: the same plus 30R instead of 0.3R.
 *
 * Fixed bandwidth h = 0.6·(n/2000)^(−1/4) (undersmoothed relative to n^(−1/5);
 * the take-up rule would make the study depend on the first stage's pilot),
 * triangular kernel, grid 30, trim 0.1, normal multipliers, seed = replication
 * number. Default: 200 replications, 499 draws, n = 2000 and 5000 (a few
 * minutes on one core); `quick` (the argument `--quick`): 50 replications,
 * 199 draws. MC standard error sqrt(p(1 − p)/reps).
 * Run: node bin/run-ts.cjs bench/validityMonteCarlo.ts [reps] [draws] [--quick]
 */
import { CutlineError, Random, bandwidthMse, bootstrapMaxima, boundaryWindow, chooseBandwidth, gathered, intervalClass, selection, validityMoments, validityReport, widenForTies } from '../src/engine';

type Shares = [number, number, number, number]; // a, n, c, f
interface Design {
  name: string;
  valid: boolean;
  below: Shares;
  above: Shares;
  /** Outcome of a unit of type t (0 a, 1 n, 2 c, 3 f) with treatment d at score r. */
  y: (t: number, d: number, r: number, rng: Random) => number;
}

const FUZZY: Shares = [0.2, 0.2, 0.6, 0];
const SHARP: Shares = [0, 0, 1, 0];
const BIND: Shares = [0.25, 0.25, 0.5, 0];
const bindY = (trendA: number, trendN: number, trendC: number) => (t: number, d: number, r: number, rng: Random) =>
  t === 2 ? (d ? rng.uniform() : -rng.uniform()) + trendC * r : 1.5 * rng.normal() + (t === 0 ? trendA : trendN) * r;
const sortY = (slope: number) => (t: number, d: number, r: number, rng: Random) =>
  (t === 1 ? 2.5 + 0.5 * rng.normal() : t === 0 ? 1 + rng.normal() : d ? 1 + rng.normal() : rng.normal()) + slope * r;

const designs: Design[] = [
  { name: 'sharp, steep trend', valid: true, below: SHARP, above: SHARP, y: (_t, _d, r, rng) => 30 * r + rng.normal() },
  { name: 'fuzzy, steep trend', valid: true, below: FUZZY, above: FUZZY, y: (_t, d, r, rng) => 30 * r + d + rng.normal() },
  { name: 'fuzzy, steep, noise sd 15', valid: true, below: FUZZY, above: FUZZY, y: (_t, d, r, rng) => 30 * r + d + 15 * rng.normal() },
  { name: 'curved (20R²)', valid: true, below: FUZZY, above: FUZZY, y: (_t, d, r, rng) => 20 * r * r + d + rng.normal() },
  { name: 'curved (2exp(2R))', valid: true, below: FUZZY, above: FUZZY, y: (_t, d, r, rng) => 2 * Math.exp(2 * r) + d + rng.normal() },
  { name: 'binding, common trend', valid: true, below: BIND, above: BIND, y: bindY(3, 3, 3) },
  { name: 'binding, types on own trends', valid: true, below: BIND, above: BIND, y: bindY(3, -3, 0) },
  {
    name: 'slack, mild trend',
    valid: true,
    below: FUZZY,
    above: FUZZY,
    y: (t, d, r, rng) => (t === 0 ? 1 : t === 1 ? -0.5 : d ? 1 : 0) + rng.normal() + 0.3 * r,
  },
  { name: 'binary', valid: true, below: FUZZY, above: FUZZY, y: (_t, d, r, rng) => (2 * r + d + rng.normal() > 0 ? 1 : 0) },
  {
    name: 'discrete, 10 values',
    valid: true,
    below: FUZZY,
    above: FUZZY,
    y: (_t, d, r, rng) => Math.min(9, Math.max(0, Math.round(4 + 3 * r + d + 1.5 * rng.normal()))),
  },
  { name: 'discrete, many values', valid: true, below: FUZZY, above: FUZZY, y: (_t, d, r, rng) => Math.round(30 * r + d + 3 * rng.normal()) },
  {
    name: 'defiers',
    valid: false,
    below: [0.2, 0.2, 0.45, 0.15],
    above: [0.2, 0.2, 0.45, 0.15],
    y: (t, d, r, rng) => (t === 3 ? (d ? 2.5 : -2.5) + 0.3 * rng.normal() : rng.normal()) + 0.3 * r,
  },
  { name: 'sorting (never-takers)', valid: false, below: FUZZY, above: [0.2, 0.32, 0.48, 0], y: sortY(0.3) },
  { name: 'sorting, steep trend', valid: false, below: FUZZY, above: [0.2, 0.32, 0.48, 0], y: sortY(30) },
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
    outcome[i] = d.y(t, dd, r, rng);
  }
  return { score, treated, outcome };
}

/**
 * The default test bandwidth of `cutline check` (check.ts): the mse bandwidth
 * of the take-up jump × n^(−1/20); when that is undefined (a sharp design),
 * the estimates' mse bandwidth × n^(−1/20); widened for ties.
 */
function defaultTestBandwidth(score: Float64Array, treated: Float64Array, outcome: Float64Array): number {
  const shrink = Math.pow(score.length, -1 / 20);
  let h: number;
  try {
    h = bandwidthMse(score, treated, 0, 'triangular').bandwidth * shrink;
  } catch (e) {
    if (!(e instanceof CutlineError)) throw e;
    h = chooseBandwidth(score, outcome, 0, { rule: 'mse', kernel: 'triangular', treated }).value * shrink;
  }
  return widenForTies(score, 0, h, 2).bandwidth;
}

/** The paper's test with every moment kept (both arms), from the engine's own pieces: for the sharp row only. */
function everyMomentPvalue(score: Float64Array, treated: Float64Array, outcome: Float64Array, h: number, draws: number, seed: number): number {
  const win = boundaryWindow(score, 0, h, 'triangular', { quadratic: false });
  const ys = Float64Array.from([...gathered(win.above, outcome), ...gathered(win.below, outcome)]);
  const m = validityMoments(win, intervalClass(ys, 30), treated, outcome, 0.1, 1);
  const n = score.length;
  const kappa = Math.sqrt(0.3 * Math.log(n));
  const bn = Math.sqrt((0.4 * Math.log(n)) / Math.log(Math.log(n)));
  let T = -Infinity;
  for (let l = 0; l < m.count; l++) T = Math.max(T, m.t[l]);
  const tstar = bootstrapMaxima([m], [selection(m, kappa, bn)], draws, seed, 'normal');
  let k = 0;
  for (const v of tstar) if (v >= T) k++;
  return k / draws;
}

const quick = process.argv.includes('--quick');
const nums = process.argv.slice(2).filter((a) => !a.startsWith('--'));
const reps = Number(nums[0] ?? (quick ? 50 : 200));
const draws = Number(nums[1] ?? (quick ? 199 : 499));
const cell = (k: number): string => {
  const p = k / reps;
  return `${(100 * p).toFixed(1).padStart(5)} ± ${(100 * Math.sqrt((p * (1 - p)) / reps)).toFixed(1).padEnd(4)}`;
};

const t0 = Date.now();
for (const rule of ['fixed', 'default'] as const) {
  console.log(
    `\nvalidity test Monte Carlo: rejection rate at 5% in % (± MC s.e.), ${reps} replications, ${draws} normal draws, ` +
      (rule === 'fixed' ? 'fixed h = 0.6·(n/2000)^(−1/4)' : "the check's default test bandwidth (mse of take-up × n^(−1/20))"),
  );
  console.log(`${'design'.padEnd(30)} ${'n=2000 published'.padStart(16)} ${'guarded'.padStart(12)}   ${'n=5000 published'.padStart(16)} ${'guarded'.padStart(12)}   mean h`);
  for (const d of designs) {
    const cols: string[] = [];
    const hs: string[] = [];
    for (const n of [2000, 5000]) {
      const rng = new Random(20260 + n);
      let pub = 0;
      let grd = 0;
      let hsum = 0;
      for (let r = 0; r < reps; r++) {
        const s = simulate(d, n, rng);
        const h = rule === 'fixed' ? 0.6 * Math.pow(n / 2000, -0.25) : defaultTestBandwidth(s.score, s.treated, s.outcome);
        hsum += h;
        const v = validityReport(s.score, s.treated, s.outcome, 0, { bandwidth: h, kernel: 'triangular', draws, seed: r + 1 });
        if (v.applicable) {
          if (v.observed.pvalue <= 0.05) pub++;
          if (v.pvalue <= 0.05) grd++;
        } else if (everyMomentPvalue(s.score, s.treated, s.outcome, h, draws, r + 1) <= 0.05) pub++;
      }
      cols.push(`${cell(pub).padStart(16)} ${cell(grd).padStart(12)}`);
      hs.push((hsum / reps).toFixed(2));
    }
    console.log(`${(d.valid ? '' : '[violation] ') + d.name}`.padEnd(30) + ` ${cols.join('   ')}   ${hs.join(', ')}`);
  }
}
console.log(`total ${((Date.now() - t0) / 1000).toFixed(0)} s`);
