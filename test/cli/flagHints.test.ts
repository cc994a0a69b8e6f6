// The command line adds the option behind an engine's words (src/cli/flagHints.ts).
import { withFlags } from '../../src/cli/flagHints';

test('options are named once beside the engine words', () => {
  expect(withFlags('the donut (radius 2) leaves too few units; choose a smaller donut, or give a bandwidth')).toBe(
    'the donut (radius 2) leaves too few units; choose a smaller donut (--donut), or give a bandwidth (--bandwidth NUM)',
  );
  expect(withFlags('too few distinct scores; give a bandwidth instead')).toBe('too few distinct scores; give a bandwidth instead (--bandwidth NUM)');
  expect(withFlags('the sensitivity multiple 5000 makes …')).toBe('the sensitivity multiple 5000 (--sensitivity) makes …');
  expect(withFlags('--kernel is given twice')).toBe('--kernel is given twice');
});
