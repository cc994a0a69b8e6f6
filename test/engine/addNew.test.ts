// src/engine/addNew.ts: warnings gathered once each, in the order first said
// (the order the committed CLI snapshot, test/cli/snapshot.test.ts, pins).
import { addNew } from '../../src/engine/addNew';

test('appends the entries not yet present, in order, once each, into the same list', () => {
  const list = ['a', 'b'];
  expect(addNew(list, ['b', 'c', 'a', 'd', 'c'])).toBe(list);
  expect(list).toEqual(['a', 'b', 'c', 'd']);
  expect(addNew([], [])).toEqual([]);
});

test('a custom sameness: two wordings of one caveat count as said once (the first wording kept)', () => {
  const few = (w: string): boolean => w.startsWith('few');
  const same = (x: string, y: string): boolean => x === y || (few(x) && few(y));
  expect(addNew(['z'], ['few: 3', 'y', 'few: 5', 'y'], same)).toEqual(['z', 'few: 3', 'y']);
  expect(addNew(['few: 1'], ['few: 3'], same)).toEqual(['few: 1']);
});
