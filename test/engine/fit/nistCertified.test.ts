/**
 * The least-squares fits behind every estimate against certified values of the
 * NIST Statistical Reference Datasets (linear least squares):
 * - Norris (line, 36 observations): test/fixtures/nist/Norris.dat, copied from
 *   SciPy's test data (the NIST file as distributed), certified values read
 *   from its header;
 * - Pontius (quadratic, 40 observations): test/fixtures/nist/pontius.json,
 *   data and certified values recalled from the NIST StRD page, matched against
 *   the GNU Scientific Library's copy (multifit/test_pontius.c) and confirmed
 *   exactly in rational arithmetic by make_nist.py.
 * The engine's side fit with the uniform kernel and a bandwidth beyond the data
 * is ordinary least squares with the intercept at the cutoff (c = 0 here); the
 * certified standard deviation of B0 is s·sqrt(Σ ω_i²) with ω the intercept
 * weights and s the residual standard deviation (OLS: Var(ω'y) = σ² Σ ω²).
 * Agreement: 11 significant digits or better on the line, 10 on the quadratic
 * (the certified values carry 15; double-precision normal equations lose the rest).
 */
import { readFileSync } from 'fs';
import { join } from 'path';
import { applyWeights, sideFit } from '../../../src/engine/fit/boundaryWindow';
import { fitPolynomial } from '../../../src/engine/fit/polyFit';
import { fitResiduals } from '../../../src/engine/fit/residuals';

const dir = join(__dirname, '../../fixtures/nist');
const digits: string[] = [];
function rel(a: number, b: number, what: string): number {
  const r = Math.abs(a - b) / Math.abs(b);
  digits.push(`${what}: ${r.toExponential(1)}`);
  return r;
}
afterAll(() => console.log(`NIST StRD relative differences\n${digits.join('\n')}`));

function readNorris(): { x: number[]; y: number[]; b0: number; b1: number; sd0: number; sd1: number; rsd: number } {
  const lines = readFileSync(join(dir, 'Norris.dat'), 'utf8').split(/\r?\n/);
  const cert = (name: string): number[] =>
    lines
      .find((l) => l.trim().startsWith(name))!
      .trim()
      .split(/\s+/)
      .slice(-2)
      .map(Number);
  const [b0, sd0] = cert('B0');
  const [b1, sd1] = cert('B1');
  const rsd = Number(lines.find((l) => /^\s*Standard Deviation\s+[0-9.]+\s*$/.test(l))!.trim().split(/\s+/).pop());
  const data = lines.slice(60, 96).map((l) => l.trim().split(/\s+/).map(Number));
  return { y: data.map((r) => r[0]), x: data.map((r) => r[1]), b0, b1, sd0, sd1, rsd };
}
const norris = readNorris();
const pontius = JSON.parse(readFileSync(join(dir, 'pontius.json'), 'utf8')) as {
  x: number[];
  y: number[];
  certified: { B: number[]; sd: number[]; residual_sd: number; r_squared: number };
};

function residualSd(e: Float64Array, p: number): number {
  return Math.sqrt(e.reduce((s, v) => s + v * v, 0) / (e.length - p));
}

describe('NIST StRD Norris (line): certified B0, B1, sd(B0), residual sd', () => {
  test('file as expected: 36 observations, certified values read from the header', () => {
    expect(norris.x).toHaveLength(36);
    expect(norris.b0).toBe(-0.262323073774029);
    expect(norris.b1).toBe(1.00211681802045);
    expect(norris.rsd).toBe(0.884796396144373);
  });
  test.each([
    ['above the cutoff (scores as given)', 1],
    ['below the cutoff (scores negated)', -1],
  ] as const)('engine side fit, %s', (_s, sgn) => {
    const score = Float64Array.from(norris.x, (v) => sgn * v);
    const side = sideFit(score, 0, 2000, 'uniform', sgn === 1, true, undefined);
    expect(side.index.length).toBe(36);
    const y = Float64Array.from(norris.y);
    expect(rel(applyWeights(side.coef1[0], side.index, y), norris.b0, `Norris B0 side ${sgn}`)).toBeLessThan(1e-11);
    expect(rel(sgn * applyWeights(side.coef1[1], side.index, y), norris.b1, `Norris B1 side ${sgn}`)).toBeLessThan(1e-12);
    const s = residualSd(fitResiduals(side, y, 1), 2);
    expect(rel(s, norris.rsd, `Norris residual sd side ${sgn}`)).toBeLessThan(1e-11);
    const sw = Math.sqrt(side.coef1[0].reduce((a, w) => a + w * w, 0));
    expect(rel(s * sw, norris.sd0, `Norris sd(B0) side ${sgn}`)).toBeLessThan(1e-11);
  });
  test('global polynomial helper (fitPolynomial, degree 1)', () => {
    const a = fitPolynomial(norris.x, norris.y, 1)!;
    expect(rel(a[0], norris.b0, 'Norris B0 fitPolynomial')).toBeLessThan(1e-11);
    expect(rel(a[1], norris.b1, 'Norris B1 fitPolynomial')).toBeLessThan(1e-12);
  });
});

describe('NIST StRD Pontius (quadratic): certified B0, B1, B2, sd(B0), residual sd', () => {
  const { B, sd, residual_sd } = pontius.certified;
  const y = Float64Array.from(pontius.y);
  test('engine side fit (local quadratic weights, uniform kernel, bandwidth beyond the data)', () => {
    const side = sideFit(Float64Array.from(pontius.x), 0, 4e6, 'uniform', true, true, undefined);
    expect(side.index.length).toBe(40);
    const q = side.coef2!;
    q.forEach((w, j) => expect(rel(applyWeights(w, side.index, y), B[j], `Pontius B${j} side fit`)).toBeLessThan(1e-10));
    const s = residualSd(fitResiduals(side, y, 2), 3);
    expect(rel(s, residual_sd, 'Pontius residual sd')).toBeLessThan(1e-10);
    const sw = Math.sqrt(q[0].reduce((a, w) => a + w * w, 0));
    expect(rel(s * sw, sd[0], 'Pontius sd(B0)')).toBeLessThan(1e-10);
  });
  test('global polynomial helper (fitPolynomial, degree 2)', () => {
    const a = fitPolynomial(pontius.x, pontius.y, 2)!;
    a.forEach((v, j) => expect(rel(v, B[j], `Pontius B${j} fitPolynomial`)).toBeLessThan(1e-10));
  });
});
