/**
 * Appends to `list` each entry of `more` that `list` does not hold yet, in
 * `more`'s order, and returns `list`: how a check gathers warnings from its
 * steps without saying one twice (the order is the order they were first
 * said). `same` decides when an entry is already there (default: equal
 * strings); a caller can count two wordings of one caveat as the same.
 *
 * @example
 *   addNew(['a', 'b'], ['b', 'c', 'c']) // ['a', 'b', 'c']
 *   addNew(['few: 3'], ['few: 5'], (x, y) => x === y || (x.startsWith('few') && y.startsWith('few'))) // ['few: 3']
 */
export function addNew<T>(list: T[], more: Iterable<T>, same?: (had: T, next: T) => boolean): T[] {
  for (const w of more) {
    if (same === undefined ? !list.includes(w) : !list.some((x) => same(x, w))) list.push(w);
  }
  return list;
}
