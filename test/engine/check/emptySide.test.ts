// Missing values that empty a side, or a whole calculation, are named (src/engine/check/emptySide.ts).
import { runCheck } from '../../../src/engine/check/check';

const n = 100;
const score = Float64Array.from({ length: n }, (_, i) => -1 + (2 * (i + 0.5)) / n);
const treated = Float64Array.from({ length: n }, (_, i) => (i % 3 === 0) !== score[i] >= 0 ? 0 : 1);
const y = Float64Array.from(score, (r, i) => r + treated[i] + Math.sin(i));
const col = (name: string, values: Float64Array, missing?: Uint8Array) => ({ name, values, missing });

test('an outcome missing on every row below the cutoff is blamed, not the cutoff', () => {
  const missing = Uint8Array.from(score, (r) => (r < 0 ? 1 : 0));
  expect(() => runCheck({ score: col('s', score), treated: col('d', treated), outcomes: [col('bill', y, missing)] }, { cutoff: 0 })).toThrow(
    'no row below the cutoff 0 has a value in every column the estimates need: of the 50 rows with a score below it, 50 miss "bill" (outcome)',
  );
});

test('a column missing on every row is named', () => {
  const all = new Uint8Array(n).fill(1);
  expect(() => runCheck({ score: col('s', score), treated: col('d', treated, all), outcomes: [col('bill', y)] }, { cutoff: 0 })).toThrow(
    'the column "d" (treated) is missing on every one of its 100 rows',
  );
});

test('the cutoff is blamed when the score itself has no unit on a side', () => {
  expect(() => runCheck({ score: col('s', score), treated: col('d', treated), outcomes: [col('bill', y)] }, { cutoff: 5 })).toThrow(/no unit has a score at or above the cutoff 5/);
});
