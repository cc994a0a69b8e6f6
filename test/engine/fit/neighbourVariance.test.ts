/**
 * The nearest-neighbour (`neighbours`) standard errors of the jump (METHODS.md §2,
 * src/engine/fit/residuals.ts) against an independent reference. Source of every
 * reference value: NumPy, brute-force nearest neighbours,
 * test/fixtures/estimates/make_neighbours.py — intercept and x² weights by
 * numpy.linalg.lstsq on each side, neighbours by sorting all other window units
 * of the side by (|x_j − x_i|, score), conventional se = sqrt(Σ ω²e²) and robust
 * se with ω − (Σω x²)q₂. Units with equal scores tie fully and the rule leaves
 * open which is taken: there the fixture lists every admissible residual.
 */
import { boundaryWindow } from '../../../src/engine/fit/boundaryWindow';
import { jumpAt } from '../../../src/engine/fit/jumpAt';
import { KernelName } from '../../../src/engine/fit/kernels';
import { neighbourResiduals } from '../../../src/engine/fit/residuals';
import { readCsv, readJson, rel } from '../../fixtures/estimates/readFixture';
import { nnBruteForce } from '../../helpers/nnBruteForce';

const SOURCE = 'NumPy, brute-force nearest neighbours, test/fixtures/estimates/make_neighbours.py';

interface SideRef {
  n: number;
  rows: number[];
  neighbour_admissible: number[][];
  ambiguous_units: number;
}
interface Case {
  name: string;
  data: string;
  cutoff: number;
  bandwidth: number;
  kernel: KernelName;
  column: string;
  above: SideRef;
  below: SideRef;
  jump: number;
  se: number;
  jump_robust: number;
  se_robust: number;
  ambiguous_units: number;
}

const fixture = readJson<{ source: string; cases: Case[] }>('neighbours.json');
const exact = fixture.cases.filter((c) => c.ambiguous_units === 0);
const run = (c: Case) => {
  const D = readCsv(c.data);
  const win = boundaryWindow(D.score, c.cutoff, c.bandwidth, c.kernel);
  return { D, win, est: jumpAt(win, D[c.column], { variance: 'neighbours' }) };
};

test('the fixture holds full-tie-free cases on every dataset, tied scores included', () => {
  expect(new Set(exact.map((c) => c.data))).toEqual(new Set(['data_a.csv', 'data_b.csv', 'data_tied.csv']));
});

describe.each(exact.map((c) => [c.name, c] as const))('%s', (_name, c) => {
  const { est } = run(c);
  test(`se and se_robust match (${SOURCE})`, () => {
    expect(rel(est.se, c.se)).toBeLessThan(1e-10); // source: NumPy, brute-force nearest neighbours, make_neighbours.py
    expect(rel(est.se_robust, c.se_robust)).toBeLessThan(1e-10); // source: NumPy, brute-force nearest neighbours, make_neighbours.py
  });
  test(`jump and bias-corrected jump match (${SOURCE})`, () => {
    // scaled by the se: a jump near 0 (A outcome) loses relative digits to cancellation
    expect(Math.abs(est.estimate - c.jump)).toBeLessThan(1e-10 * Math.max(Math.abs(c.jump), c.se));
    expect(Math.abs(est.estimate_robust - c.jump_robust)).toBeLessThan(1e-10 * Math.max(Math.abs(c.jump_robust), c.se_robust));
  });
});

describe.each(fixture.cases.map((c) => [c.name, c] as const))('%s, unit by unit', (_name, c) => {
  const { D, win } = run(c);
  test.each([
    ['above', win.above, c.above],
    ['below', win.below, c.below],
  ] as const)(`%s: window rows and every nearest-neighbour residual is one the rule admits (${SOURCE})`, (_s, side, ref) => {
    expect(Array.from(side.index).sort((a, b) => a - b)).toEqual(ref.rows);
    const e = neighbourResiduals(side, D[c.column]);
    const at = new Map(ref.rows.map((r, t) => [r, ref.neighbour_admissible[t]]));
    let worst = 0;
    side.index.forEach((row, t) => {
      const d = Math.min(...at.get(row)!.map((a) => Math.abs(e[t] - a) / Math.max(1, Math.abs(a))));
      worst = Math.max(worst, d);
    });
    expect(worst).toBeLessThan(1e-10); // source: NumPy, brute-force nearest neighbours, make_neighbours.py
  });
});

test('nearest-neighbour standard errors do not depend on the order of the rows (all ties at the 3rd distance are taken)', () => {
  // Property of the rule itself (src/engine/fit/residuals.ts); the data: the tied grid of make_neighbours.py.
  const D = readCsv('data_tied.csv');
  const n = D.score.length;
  const perm = Array.from({ length: n }, (_, i) => (i * 17 + 5) % n); // 17 is coprime with n = 41
  const shuffled = (a: Float64Array): Float64Array => Float64Array.from(perm, (p) => a[p]);
  for (const kernel of ['triangular', 'uniform'] as const) {
    const a = jumpAt(boundaryWindow(D.score, 0, 3.5, kernel), D.y_row, { variance: 'neighbours' });
    const b = jumpAt(boundaryWindow(shuffled(D.score), 0, 3.5, kernel), shuffled(D.y_row), { variance: 'neighbours' });
    expect(rel(b.se, a.se)).toBeLessThan(1e-12);
    expect(rel(b.se_robust, a.se_robust)).toBeLessThan(1e-12);
  }
});

test('grouped nn residuals equal the unit-by-unit rule whatever the ties (reference: test/helpers/nnBruteForce.ts)', () => {
  // Seeded data: whole-number scores, one repeated score, a tie group beside singletons, sides of 1–4 units.
  let s = 12345;
  const rand = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648);
  const designs: Array<[string, (i: number) => number, number]> = [
    ['whole numbers', () => Math.floor(rand() * 12), 300],
    ['one repeated score', () => 4, 200],
    ['a tie group among singletons', (i) => (i % 3 === 0 ? 2 : rand() * 5), 150],
    ['grid with spacing 0.1', () => Math.floor(rand() * 30) * 0.1, 250],
    ['continuous', () => rand(), 200],
    ['two units', () => Math.floor(rand() * 2), 2],
    ['four units, two scores', (i) => i % 2, 4],
  ];
  for (const [, draw, n] of designs) {
    const x = Float64Array.from({ length: n }, (_, i) => draw(i)).sort();
    const v = Float64Array.from({ length: n }, () => rand() * 10 - 3);
    const side = { index: Int32Array.from({ length: n }, (_, i) => i), x };
    const ours = neighbourResiduals(side, v);
    const ref = nnBruteForce(x, v);
    for (let i = 0; i < n; i++) expect(Math.abs(ours[i] - ref[i])).toBeLessThan(1e-10 * (1 + Math.abs(ref[i])));
  }
});
