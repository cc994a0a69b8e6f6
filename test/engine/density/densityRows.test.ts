import { binnedMeans } from '../../../src/engine/plots/binnedMeans';
import { permutationBalanceTest } from '../../../src/engine/covariates/covariatePermutation';
import { localPolynomialDensityTest } from '../../../src/engine/density/densityLocalPolynomial';
import { mccraryTest } from '../../../src/engine/density/densityMcCrary';
import { betaMixture } from '../../helpers/densityMixture';

/** `rows` restricts every check to those positions: same numbers as on the subset itself (internal consistency). */
describe('rows option of the issue-4 checks', () => {
  const all = betaMixture(6000, 0.45, 21);
  const cov = all.map((v, i) => v + Math.sin(i));
  const rows = Int32Array.from({ length: 3000 }, (_, k) => 2 * k + 1);
  const sub = Float64Array.from(rows, (i) => all[i]);
  const subCov = Float64Array.from(rows, (i) => cov[i]);

  it('McCrary and local polynomial density', () => {
    expect(mccraryTest(all, 0, { rows })).toEqual(mccraryTest(sub, 0));
    expect(localPolynomialDensityTest(all, 0, { rows })).toEqual(localPolynomialDensityTest(sub, 0));
  });

  it('permutation test and binned means', () => {
    const a = permutationBalanceTest(all, cov, 0, { rows, permutations: 99 });
    const b = permutationBalanceTest(sub, subCov, 0, { permutations: 99 });
    expect(a.statistic).toBe(b.statistic);
    expect(a.q).toBe(b.q);
    expect(binnedMeans(all, cov, 0, { rows })).toEqual(binnedMeans(sub, subCov, 0));
  });
});
