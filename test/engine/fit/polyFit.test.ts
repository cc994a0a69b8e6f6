/**
 * The engine's one weighted polynomial fit (src/engine/fit/polyFit.ts) against
 * NumPy: test/fixtures/fit/polyfit_fixture.json, written by make_polyfit.py
 * beside it (numpy.linalg.lstsq on sqrt(w)·Z for the coefficients and, with the
 * right-hand side diag(sqrt(w)), for the coefficient weights (Z'WZ)⁻¹Z'W; each
 * reference confirmed there against the exact rational solution to 1e-12).
 * Cases: the local line, quadratic and cubic at a cutoff (triangular and
 * Epanechnikov kernels), a global quartic, a local line with zero weights, a
 * quadratic far from zero (centring), and a cubic with a step. The NIST StRD
 * certified fits (Norris, Pontius) are in nistCertified.test.ts.
 */
import fixture from '../../fixtures/fit/polyfit_fixture.json';
import {
  coefficientWeights,
  fitPolynomial,
  polyCoefficients,
  polyCross,
  polyDerivative,
  polyFrame,
  polyFrameSorted,
  polyInverse,
  polyMoments,
  polyValue,
} from '../../../src/engine/fit/polyFit';

type Case = { name: string; x: number[]; y: number[]; w: number[]; degree: number; origin: number; coef: number[]; about?: number; step?: number; weights?: number[][] };
const cases = fixture.cases as Case[];

/** Largest difference relative to the larger of 1 and the reference's largest entry. */
function relDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let big = 1;
  let d = 0;
  for (let i = 0; i < b.length; i++) big = Math.max(big, Math.abs(b[i]));
  for (let i = 0; i < b.length; i++) d = Math.max(d, Math.abs(a[i] - b[i]));
  return d / big;
}

describe.each(cases.map((c) => [c.name, c] as const))('%s (NumPy lstsq)', (_name, c) => {
  const x = Float64Array.from(c.x);
  const y = Float64Array.from(c.y);
  const w = Float64Array.from(c.w);
  const frame = polyFrame(x, c.about, w);

  test('coefficients from the moments agree to 1e-11', () => {
    const mom = polyMoments(x, c.degree, frame, { weights: w, y, step: c.step });
    const inv = polyInverse(mom)!;
    const beta = polyCoefficients(inv, mom.cross!, frame, c.degree, c.origin);
    expect(beta).toHaveLength(c.coef.length);
    expect(relDiff(beta, c.coef)).toBeLessThan(1e-11);
    // The same column through polyCross on the known Γ⁻¹.
    const again = polyCoefficients(inv, polyCross(x, y, c.degree, frame, { weights: w, step: c.step }), frame, c.degree, c.origin);
    expect(relDiff(again, c.coef)).toBeLessThan(1e-11);
  });

  // fitPolynomial gives coefficients about 0: for the data far from zero, evaluating them at x loses digits by itself.
  if (c.step === undefined && c.origin === 0) {
    test('fitPolynomial (one call) agrees to 1e-11 in the fitted values', () => {
      const a = fitPolynomial(x, y, c.degree, { weights: w, about: c.about })!;
      const fitted = c.x.map((v) => polyValue(a, v));
      const ref = c.x.map((v) => polyValue(c.coef, v - c.origin));
      expect(relDiff(fitted, ref)).toBeLessThan(1e-11);
    });
  }

  if (c.weights) {
    test('every coefficient weight W_j(i) agrees to 1e-11', () => {
      const inv = polyInverse(polyMoments(x, c.degree, frame, { weights: w }))!;
      c.weights!.forEach((row, j) => expect(relDiff(coefficientWeights(x, w, inv, frame, j, c.origin), row)).toBeLessThan(1e-11));
    });
  }
});

describe('conditioning and edge cases', () => {
  test('the frame: centred at the mean (or where asked), scaled by the largest distance among units of positive weight', () => {
    expect(polyFrame([1, 2, 6])).toEqual({ centre: 3, scale: 3 });
    expect(polyFrame([-4, 1, 2], 0)).toEqual({ centre: 0, scale: 4 });
    expect(polyFrame([-4, 1, 2], 0, [0, 1, 1])).toEqual({ centre: 0, scale: 2 });
    expect(polyFrame([5, 5], 5, undefined, 7)).toEqual({ centre: 5, scale: 7 });
  });

  test('a quartic in large units far from zero: centring keeps the normal equations solvable (an uncentred frame is singular)', () => {
    const x = Array.from({ length: 30 }, (_, i) => 1e6 + 10 * i);
    const y = x.map((v) => 2 + 1e-3 * (v - 1e6) - 4e-6 * (v - 1e6) ** 2);
    const uncentred = polyMoments(x, 4, polyFrame(x, 0), { y });
    expect(polyInverse(uncentred)).toBeNull();
    const f = polyFrame(x);
    const mom = polyMoments(x, 4, f, { y });
    const b = polyCoefficients(polyInverse(mom)!, mom.cross!, f, 4, 1e6);
    expect(relDiff(b, [2, 1e-3, -4e-6, 0, 0])).toBeLessThan(1e-12);
  });

  test('a singular design is null, never NaN: too few units, one distinct x, or a step on one side only', () => {
    expect(fitPolynomial([1, 2], [3, 4], 2)).toBeNull();
    expect(fitPolynomial([3, 3, 3, 3], [1, 2, 3, 4], 1)).toBeNull();
    const x = [1, 2, 3, 4, 5, 6];
    expect(polyInverse(polyMoments(x, 2, polyFrame(x), { step: 0 }))).toBeNull();
  });

  test('a lower degree from the same moments: the line of a quadratic fit is the line fitted alone', () => {
    const x = [0.5, 1, 1.5, 2, 3, 4.5];
    const y = [1, 0.2, 2.2, 1.7, 3.1, 2.9];
    const f = polyFrame(x);
    const mom = polyMoments(x, 2, f, { y });
    const line = polyCoefficients(polyInverse(mom, 1)!, mom.cross!, f, 1);
    // Closed form of the least-squares line (means and centred sums).
    const mx = x.reduce((s, v) => s + v, 0) / 6;
    const my = y.reduce((s, v) => s + v, 0) / 6;
    const sxy = x.reduce((s, v, i) => s + (v - mx) * (y[i] - my), 0);
    const sxx = x.reduce((s, v) => s + (v - mx) ** 2, 0);
    expect(line[1]).toBeCloseTo(sxy / sxx, 13);
    expect(line[0]).toBeCloseTo(my - (sxy / sxx) * mx, 13);
  });

  test('the doc comment\'s examples', () => {
    const a = fitPolynomial([0, 1, 2, 3], [1, 2, 5, 10], 2)!;
    expect(Array.from(a, (v) => +v.toFixed(12))).toEqual([1, 0, 1]);
    const x = Float64Array.of(0.1, 0.4, 0.7);
    const k = x.map((v) => 1 - v);
    const f = polyFrame(x, 0);
    const w0 = coefficientWeights(x, k, polyInverse(polyMoments(x, 1, f, { weights: k }))!, f, 0);
    // A line through the points is reproduced exactly: Σ W_i (2 + 3x_i) = 2.
    expect(w0.reduce((s, v, i) => s + v * (2 + 3 * x[i]), 0)).toBeCloseTo(2, 14);
    expect(polyDerivative([1, 0, 1], 3, 1)).toBe(6);
  });
});

test('polyFrameSorted: the frame of polyFrame from the ends of ascending x', () => {
  // Ascending samples with negatives, ties, one unit, all equal (fallback) and none.
  const cases = [
    Float64Array.of(-3.5, -1, -1, 0.25, 2),
    Float64Array.of(0.5, 0.75, 9),
    Float64Array.of(-7),
    Float64Array.of(0, 0, 0),
    new Float64Array(0),
  ];
  for (const x of cases) {
    for (const about of [0, 0.5]) {
      expect(polyFrameSorted(x, about, 3)).toEqual(polyFrame(x, about, undefined, 3));
    }
  }
});
