/**
 * Cluster warnings (src/engine/check/designWarnings.ts) and the fact behind
 * them: with one cluster on each side of the cutoff the clustered standard
 * error is about 0 (a side's residuals weighted by its own fit's weights sum
 * to zero — the normal equations of least squares), while nn gives a real one.
 */
import { clusterWarnings, FEW_CLUSTERS } from '../../../src/engine/check/designWarnings';
import { boundaryWindow } from '../../../src/engine/fit/boundaryWindow';
import { jumpAt } from '../../../src/engine/fit/jumpAt';

const n = 200;
const score = Float64Array.from({ length: n }, (_, i) => -1 + (2 * (i + 0.5)) / n);
const y = Float64Array.from(score, (r, i) => r + (r >= 0 ? 1 : 0) + Math.sin(i * 1.7));
const sides = Int32Array.from(score, (r) => (r >= 0 ? 1 : 0));

test('clusters that are the two sides: clustered se about 0, and both warnings', () => {
  const win = boundaryWindow(score, 0, 0.5, 'triangular');
  const clustered = jumpAt(win, y, { variance: 'cluster', clusters: sides });
  const nn = jumpAt(win, y, { variance: 'neighbours' });
  expect(clustered.se).toBeLessThan(1e-10 * nn.se);
  const w = clusterWarnings(sides, win.below.index, win.above.index, ['west', 'east'], 'g');
  expect(w).toHaveLength(2);
  expect(w[0]).toMatch(/below the cutoff all belong to the cluster "west", and those above the cutoff all belong to the cluster "east"/);
  expect(w[1]).toMatch(new RegExp(`only 2 clusters of "g" \\(fewer than ${FEW_CLUSTERS}\\)`));
});

test('many clusters spread over both sides: no warning', () => {
  const many = Int32Array.from({ length: n }, (_, i) => i % 25);
  const win = boundaryWindow(score, 0, 0.5, 'triangular');
  expect(clusterWarnings(many, win.below.index, win.above.index, [], 'g')).toEqual([]);
  const few = Int32Array.from({ length: n }, (_, i) => i % 3);
  expect(clusterWarnings(few, win.below.index, win.above.index, [], 'g')).toEqual([expect.stringMatching(/only 3 clusters/)]);
});
