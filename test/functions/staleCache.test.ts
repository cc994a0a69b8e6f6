// The functions' cache never serves a stale result: with the built bundle
// (dist/functions.js) warm on one data set, a copy with a single cell changed
// (first, middle or last data row, the title, any range; a number by a hair,
// 0 ↔ −0, a number ↔ blank, "" ↔ null ↔ "NA" ↔ #N/A, TRUE ↔ 1 ↔ FALSE) gives
// exactly what the engine gives on that copy's columns read afresh by the
// input adapter from the sources (no cache involved), and the unchanged data
// still gives its own result afterwards. The reference is the engine called
// directly, as in bundle.test.ts.
import * as engine from '../../src/engine';
import { rangeColumns } from '../../src/input/range';
import { errorOf, loadFunctionsBundle } from '../helpers/functionsBundle';

const { functions: fn } = loadFunctionsBundle();
const N = 400;
const H = 0.6;

/** A seeded fuzzy design, Excel-shaped: a title, one cell per row; the last unit just above the cutoff; zeros in the outcome. */
function design(): { S: unknown[][]; D: unknown[][]; Y: unknown[][] } {
  let seed = 12345;
  const u = (): number => ((seed = (Math.imul(seed, 1103515245) + 12345) >>> 0) / 4294967296);
  const S: unknown[][] = [['score']];
  const D: unknown[][] = [['treated']];
  const Y: unknown[][] = [['outcome']];
  for (let i = 0; i < N; i++) {
    const x = i === N - 1 ? 0.02 : Number((2 * u() - 1).toFixed(4));
    const d = u() < (x >= 0 ? 0.7 : 0.2);
    S.push([x]);
    D.push([d]);
    Y.push([i === 6 || i === N - 2 ? 0 : Number((1 + x + (d ? 0.8 : 0) + u()).toFixed(4))]);
  }
  return { S, D, Y };
}

const { S, D, Y } = design();
const edit = (cells: unknown[][], k: number, v: unknown): unknown[][] => cells.map((row, j) => (j === k ? [v] : [...row]));

/** The engine's effect on the cells read afresh (the reference), or the input error's message. */
function reference(s: unknown[][], d: unknown[][], y: unknown[][]): number | string {
  try {
    const [score, treated, outcome] = rangeColumns([
      { argument: 'score', cells: s },
      { argument: 'treated', cells: d, binary: true },
      { argument: 'outcome', cells: y },
    ]);
    const missing = { score: score.missing, treated: treated.missing, outcome: outcome.missing };
    return engine.complierEffect(score.values, treated.values, outcome.values, 0, { missing, bandwidth: H }).effect.estimate;
  } catch (e) {
    return `CUTLINE.EFFECT: ${(e as Error).message}`;
  }
}

/** The bundle's EFFECT, or its Excel error's message. */
function effectOrError(s: unknown[][], d: unknown[][], y: unknown[][]): number | string {
  try {
    return (fn.get('EFFECT')!(s, d, y, 0, H) as number[][])[0][0];
  } catch (e) {
    return (e as Error).message;
  }
}
const effect = (s: unknown[][], d: unknown[][], y: unknown[][]): number => (fn.get('EFFECT')!(s, d, y, 0, H) as number[][])[0][0];
/** The effect and the rows it used (detail), which tell a blank from a zero even where the estimate would not. */
const used = (s: unknown[][], d: unknown[][], y: unknown[][]): unknown =>
  (fn.get('EFFECT')!(s, d, y, 0, H, null, true) as unknown[][]).find((r) => r[0] === 'rows_used')?.[1];

const last = N; // the last data row's index among the cells (the title is 0)
const edits: Array<[string, 'S' | 'D' | 'Y', number, unknown]> = [
  ['outcome, first row, +1', 'Y', 1, (Y[1][0] as number) + 1],
  ['outcome, middle row, by one unit in the last place', 'Y', 200, (Y[200][0] as number) * (1 + Number.EPSILON)],
  ['outcome, last row, +1', 'Y', last, (Y[last][0] as number) + 1],
  ['outcome, last row, blank ""', 'Y', last, ''],
  ['outcome, last row, blank null', 'Y', last, null],
  ['outcome, last row, "NA"', 'Y', last, 'NA'],
  ['outcome, last row, #N/A', 'Y', last, { code: '#N/A' }],
  ['outcome, last row, the text "0.5" (reads as 0.5)', 'Y', last, String(Y[last][0])],
  ['outcome 0 → −0 (row 7)', 'Y', 7, -0],
  ['outcome 0 → blank (row 7)', 'Y', 7, ''],
  ['outcome 0 → −0 (last row but one)', 'Y', last - 1, -0],
  ['outcome 0 → null (last row but one)', 'Y', last - 1, null],
  ['treated, last row, TRUE → 1', 'D', last, Number(D[last][0] as boolean)],
  ['treated, last row, flipped', 'D', last, !(D[last][0] as boolean)],
  ['treated, first row, "TRUE" as text', 'D', 1, D[1][0] ? 'TRUE' : 'FALSE'],
  ['treated, middle row, blank', 'D', 200, ''],
  ['score, last row, by one unit in the last place', 'S', last, 0.02 * (1 + Number.EPSILON)],
  ['score, last row, to the other side', 'S', last, -0.02],
  ['score, title renamed', 'S', 0, 'running score'],
  ['score, title removed (a blank)', 'S', 0, ''],
];

describe('a single changed cell is never served a stale result', () => {
  const base = effect(S, D, Y);
  const baseUsed = used(S, D, Y);
  test('the unchanged data: the engine’s effect', () => {
    expect(base).toBe(reference(S, D, Y));
  });
  test.each(edits)('%s', (_label, which, k, v) => {
    const cells = { S, D, Y };
    cells[which] = edit(cells[which], k, v);
    const want = reference(cells.S, cells.D, cells.Y);
    // Twice: computed, then from the cache; then the unchanged data is still its own.
    expect(effectOrError(cells.S, cells.D, cells.Y)).toBe(want);
    expect(effectOrError(cells.S, cells.D, cells.Y)).toBe(want);
    expect(effect(S, D, Y)).toBe(base);
    expect(used(S, D, Y)).toBe(baseUsed);
  });
  test('the test can fail: changes of values the estimate uses move it', () => {
    const moving = ['outcome, last row, +1', 'outcome, last row, blank ""', 'outcome, last row, #N/A', 'treated, last row, flipped', 'score, last row, to the other side'];
    for (const [label, which, k, v] of edits.filter(([l]) => moving.includes(l))) {
      const cells = { S, D, Y };
      cells[which] = edit(cells[which], k, v);
      expect([label, effect(cells.S, cells.D, cells.Y) === base]).toEqual([label, false]);
    }
  });
  test('0 and −0 are told apart by the cache (the columns differ in sign)', () => {
    const negative = edit(Y, 7, -0);
    const [, , y] = rangeColumns([
      { argument: 'score', cells: S },
      { argument: 'treated', cells: D, binary: true },
      { argument: 'outcome', cells: negative },
    ]);
    expect(Object.is(y.values[6], -0)).toBe(true);
    expect(effect(S, D, negative)).toBe(reference(S, D, negative));
  });
  test('a range one cell longer (a number after the last row) is an error, not the cached result', async () => {
    const longer = [...Y.map((r) => [...r]), [1.5]];
    const e = await errorOf(() => fn.get('EFFECT')!(S, D, longer, 0, H));
    expect(e.code).toBe('#VALUE!');
    expect(effect(S, D, [...Y.map((r) => [...r]), ['']])).toBe(base);
  });
});
