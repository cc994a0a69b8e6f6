// windowValues: a column at a window's units, below the cutoff first — a view of the sorted column when it can be.
import { boundaryWindow } from '../../../src/engine/fit/boundaryWindow';
import { gathered } from '../../../src/engine/fit/residuals';
import { windowValues } from '../../../src/engine/fit/windowValues';
import { indexScores } from '../../../src/engine/data/indexedScore';
import { Random } from '../../../src/engine/numeric/random';

function design(n: number): { score: Float64Array; y: Float64Array } {
  const rng = new Random(11);
  const score = new Float64Array(n);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    score[i] = Math.round((2 * rng.uniform() - 1) * 1000) / 1000;
    y[i] = score[i] + rng.normal();
  }
  return { score, y };
}

/** The reference: each unit's value looked up by its position, below then above. */
function byPositions(win: ReturnType<typeof boundaryWindow>, y: Float64Array): number[] {
  return [...Array.from(win.below.index, (i) => y[i]), ...Array.from(win.above.index, (i) => y[i])];
}

test('a score handle: the values of the window, below then above, as a view of one array', () => {
  const { score, y } = design(3000);
  const win = boundaryWindow(indexScores(score), 0, 0.4, 'triangular');
  const v = windowValues(win, y);
  expect(Array.from(v)).toEqual(byPositions(win, y));
  expect(v.length).toBe(win.below.index.length + win.above.index.length);
  // No copy: the view shares the buffer of the sides' gathered columns.
  expect(v.buffer).toBe(gathered(win.below, y).buffer);
});

test('a plain array or chosen rows: the same values, copied', () => {
  const { score, y } = design(3000);
  const rows = Int32Array.from({ length: 1500 }, (_, k) => 2 * k);
  for (const win of [boundaryWindow(Array.from(score), 0, 0.4, 'triangular'), boundaryWindow(score, 0, 0.4, 'triangular', { rows })]) {
    const v = windowValues(win, y);
    expect(Array.from(v)).toEqual(byPositions(win, y));
  }
});
