import fx from '../../fixtures/balance/balance_fixtures.json';
import { CutlineError } from '../../../src/engine/errors';
import { holmAdjust } from '../../../src/engine/numeric/holm';

describe('holmAdjust (Holm 1979)', () => {
  it('matches the hand computation in test/fixtures/balance/make_balance_fixtures.py (python3)', () => {
    for (const c of fx.holm) {
      const got = holmAdjust(c.p);
      c.adjusted.forEach((v, i) => expect(got[i]).toBeCloseTo(v, 14));
    }
  });

  it('worked example from the formula: p = (0.01, 0.04, 0.03) → (3·0.01, max(2·0.03, …), 0.06)', () => {
    // Sorted 0.01, 0.03, 0.04: 3·0.01 = 0.03; 2·0.03 = 0.06; max(0.06, 1·0.04) = 0.06.
    const got = holmAdjust([0.01, 0.04, 0.03]);
    expect(got[0]).toBeCloseTo(0.03, 15);
    expect(got[1]).toBeCloseTo(0.06, 15);
    expect(got[2]).toBeCloseTo(0.06, 15);
  });

  it('empty family, and a p-value outside [0, 1] is an error', () => {
    expect(holmAdjust([])).toEqual([]);
    expect(() => holmAdjust([0.1, NaN])).toThrow(CutlineError);
    expect(() => holmAdjust([0.1, 1.2])).toThrow(/p-value 2/);
  });
});
