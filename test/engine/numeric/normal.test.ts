/**
 * Normal distribution functions (METHODS.md §2: relative error below 1e-12)
 * against published table values and SciPy.
 *
 * Published digits: Abramowitz & Stegun (1964), Handbook of Mathematical
 * Functions, Table 26.1 (P(x), 15 decimals), the large-x tail Q(x), and Table
 * 26.5 (percentage points, 10 decimals). The digits below are recalled from
 * memory; test/fixtures/estimates/make_normal.py asserts each one against
 * scipy.stats.norm, so none of them is trusted on memory alone.
 * SciPy values: test/fixtures/estimates/normal_scipy.json (from make_normal.py).
 */
import { normalCdf, normalQuantile, normalUpperTail, twoSidedPvalue } from '../../../src/engine/numeric/normal';
import { readJson, rel } from '../../fixtures/estimates/readFixture';

// A&S Table 26.1, P(x) to 15 decimals (recalled from memory; confirmed by SciPy in make_normal.py).
const AS_26_1: [number, string][] = [
  [0.5, '0.691462461274013'],
  [1.0, '0.841344746068543'],
  [1.5, '0.933192798731142'],
  [2.0, '0.977249868051821'],
  [2.5, '0.993790334674224'],
  [3.0, '0.998650101968370'],
];
// A&S large-x upper tail Q(x), 12 significant digits (recalled from memory; confirmed by SciPy).
const AS_TAIL: [number, string][] = [
  [4, '3.16712418331e-5'],
  [5, '2.86651571879e-7'],
  [6, '9.86587645038e-10'],
  [7, '1.27981254389e-12'],
  [8, '6.22096057427e-16'],
  [10, '7.61985302416e-24'],
];
// A&S Table 26.5, x with Q(x) = q, 10 decimals (recalled from memory; confirmed by SciPy).
const AS_26_5: [number, string][] = [
  [0.05, '1.6448536270'],
  [0.025, '1.9599639845'],
  [0.005, '2.5758293035'],
  [0.001, '3.0902323062'],
  [0.0005, '3.2905267315'],
];

describe('published tables (A&S 1964), to the digits they carry', () => {
  test.each(AS_26_1)('P(%d) = %s (Table 26.1, 15 decimals)', (x, s) => {
    // 15 decimals on a value near 1: relative error ≤ 1e-12 and within half a unit of the last place.
    expect(Math.abs(normalCdf(x) - Number(s))).toBeLessThanOrEqual(0.5e-15 + 1e-16);
    expect(rel(normalCdf(x), Number(s))).toBeLessThanOrEqual(1e-12);
    expect(Math.abs(normalCdf(-x) - (1 - Number(s)))).toBeLessThanOrEqual(0.5e-15 + 1e-16);
  });
  test.each(AS_TAIL)('Q(%d) = %s (large-x tail, 12 significant digits)', (x, s) => {
    expect(rel(normalUpperTail(x), Number(s))).toBeLessThanOrEqual(1e-11);
  });
  test.each(AS_26_5)('upper %d point = %s (Table 26.5, 10 decimals)', (q, s) => {
    expect(Math.abs(normalQuantile(1 - q) - Number(s))).toBeLessThanOrEqual(0.5e-10);
    expect(Math.abs(-normalQuantile(q) - Number(s))).toBeLessThanOrEqual(0.5e-10);
  });
});

interface Scipy {
  source: string;
  cdf: [number, number][];
  sf: [number, number][];
  two_sided: [number, number][];
  ppf: [number, number][];
  ppf_grid: [number, number][];
}
const sp = readJson<Scipy>('normal_scipy.json');
const TOL = 1e-12;

describe(`scipy.stats.norm (${sp.source}), relative error ≤ 1e-12`, () => {
  test.each(sp.cdf)('cdf(%d)', (z, v) => expect(rel(normalCdf(z), v)).toBeLessThanOrEqual(TOL));
  test.each(sp.sf)('upper tail (sf) at %d', (z, v) => expect(rel(normalUpperTail(z), v)).toBeLessThanOrEqual(TOL));
  test.each(sp.two_sided)('two-sided p at ±%d', (z, v) => {
    expect(rel(twoSidedPvalue(z), v)).toBeLessThanOrEqual(TOL);
    expect(rel(twoSidedPvalue(-z), v)).toBeLessThanOrEqual(TOL);
  });
  test.each(sp.ppf)('quantile(%d)', (p, v) => expect(rel(normalQuantile(p), v)).toBeLessThanOrEqual(TOL));
  test(`quantile on a sweep of ${sp.ppf_grid.length} p from 1e-300 to 1 − 1e-15`, () => {
    const worst = Math.max(...sp.ppf_grid.map(([p, v]) => rel(normalQuantile(p), v)));
    expect(worst).toBeLessThanOrEqual(TOL);
  });
});

test('edge values', () => {
  expect(normalQuantile(0)).toBe(-Infinity);
  expect(normalQuantile(1)).toBe(Infinity);
  expect(normalCdf(0)).toBe(0.5);
  expect(normalQuantile(0.5)).toBe(0);
  expect(twoSidedPvalue(0)).toBe(1);
  // The tail far out is not lost to cancellation: 1 − cdf(10) would be 0.
  expect(normalUpperTail(10)).toBeGreaterThan(0);
});
