// The command line names the flag behind an engine error by the error's structured
// `argument` (src/cli/flagHints.ts), never by its wording. Expectations: the flags
// of README.md's command-line section.
import { FLAGS, flagHint } from '../../src/cli/flagHints';
import { errorLine } from '../../src/cli/errorLine';
import { checkMultiples, CutlineError, blameDonut, selectBandwidth } from '../../src/engine';

const caught = (f: () => unknown): CutlineError => {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(CutlineError);
    return e as CutlineError;
  }
  throw new Error('no error');
};

test('every flag fires for an error naming its argument, whatever the wording', () => {
  for (const [argument, flag] of Object.entries(FLAGS)) {
    const e = new CutlineError('something about this input', { code: 'option', argument });
    expect(flagHint(e)).toBe(flag);
    expect(errorLine(e)).toBe(`${flag}: something about this input`);
  }
  expect(FLAGS.trim).toBe('--trim');
  // Words alone give no flag: "use a trim near the default 0.1" without an argument is said as it is.
  expect(errorLine(new CutlineError('use a trim near the default 0.1; give a bandwidth'))).toBe('use a trim near the default 0.1; give a bandwidth');
  expect(flagHint(new CutlineError('x', { argument: 'arm' }))).toBeUndefined();
  expect(flagHint(new CutlineError('x', { argument: 'toString' }))).toBeUndefined();
});

test('the engine errors that advise an option carry it as their argument: sensitivity, donut, bandwidth', () => {
  const score = Array.from({ length: 40 }, (_, i) => -1 + i / 20);
  const sens = caught(() => checkMultiples([1, 5000], 0.5, score));
  expect(errorLine(sens)).toMatch(/^--sensitivity: the sensitivity multiple 5000 makes/);

  const donut = caught(() =>
    blameDonut(
      0.9,
      () => {
        throw new CutlineError('too few units near the cutoff to choose a bandwidth', { code: 'too-few' });
      },
      () => undefined,
    ),
  );
  expect(errorLine(donut)).toMatch(/^--donut: the donut \(radius 0\.9\) leaves too few units/);

  // Two units on each side: the bandwidth rule has nothing to measure; a typed bandwidth is the way past it.
  const few = [-2, -1, 1, 2];
  const rule = caught(() => selectBandwidth(few, [0, 1, 3, 4], 0, {}));
  expect(rule.argument).toBe('bandwidth');
  expect(errorLine(rule)).toMatch(/^--bandwidth: .*(give a|widen the) bandwidth/);
  // With a typed bandwidth the rule is not run, and a bad one is refused as before.
  expect(selectBandwidth(few, [0, 1, 3, 4], 0, { bandwidth: 3 }).bandwidth).toBe(3);
});
