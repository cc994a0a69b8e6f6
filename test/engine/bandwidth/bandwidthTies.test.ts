// Cutline's own rule for mass points (src/engine/bandwidth/bandwidthTies.ts), checked by hand computation:
// no outside source exists for this choice (common practice is to widen; the 1.25 factor is ours).
import { widenForTies } from '../../../src/engine/bandwidth/bandwidthTies';
import { chooseBandwidth } from '../../../src/engine/bandwidth/bandwidth';

describe('widenForTies', () => {
  const ints = Float64Array.from({ length: 220 }, (_, i) => (i % 11) - 5); // −5..5, 20 units each

  test('widens to 1.25 × the farther third distinct score', () => {
    // Below 0: distances 1, 2, 3 → 3; at or above 0: distances 0, 1, 2 → 2; reach 3.
    expect(widenForTies(ints, 0, 1.6, 3)).toEqual({ bandwidth: 3.75, widened: true });
    // Two distinct scores: below 1, 2 → 2; above 0, 1 → 1; reach 2.
    expect(widenForTies(ints, 0, 1.6, 2)).toEqual({ bandwidth: 2.5, widened: true });
  });

  test('leaves a bandwidth that already reaches far enough', () => {
    expect(widenForTies(ints, 0, 3.5, 3)).toEqual({ bandwidth: 3.5, widened: false });
  });

  test('a rule bandwidth is widened and says so; a typed one is not', () => {
    const y = Float64Array.from(ints, (r, i) => r + (r >= 0 ? 1 : 0) + 0.1 * Math.sin(i));
    const rule = chooseBandwidth(ints, y, 0, { kernel: 'triangular', rule: 'mse' });
    expect(rule.value).toBeGreaterThan(3);
    const typed = chooseBandwidth(ints, y, 0, { kernel: 'triangular', typed: 1.6 });
    expect(typed).toEqual({ value: 1.6, rule: 'typed', warnings: [] });
  });
});
