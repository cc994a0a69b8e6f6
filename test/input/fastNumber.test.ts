// The character-code number reader against JavaScript's own Number() (ECMAScript's
// correctly rounded string-to-number conversion) on random decimal texts.
import fc from 'fast-check';
import { fastNumber, MISSING, SLOW } from '../../src/input/fastNumber';

function read(s: string): number | typeof SLOW | typeof MISSING {
  const b = new TextEncoder().encode(s);
  return fastNumber(b, 0, b.length);
}

describe('fastNumber', () => {
  test('equals Number() bit for bit whenever it answers', () => {
    const decimal = fc
      .tuple(
        fc.constantFrom('', '-', '+'),
        fc.stringMatching(/^[0-9]{0,12}$/),
        fc.boolean(),
        fc.stringMatching(/^[0-9]{0,9}$/),
        fc.option(fc.tuple(fc.constantFrom('e', 'E'), fc.constantFrom('', '-', '+'), fc.integer({ min: 0, max: 40 }))),
      )
      .map(([sg, a, dot, b, e]) => `${sg}${a}${dot ? '.' : ''}${b}${e ? `${e[0]}${e[1]}${e[2]}` : ''}`);
    fc.assert(
      fc.property(decimal, (s) => {
        const v = read(s);
        if (v === SLOW || v === MISSING) return;
        expect(Object.is(v, Number(s))).toBe(true);
      }),
      { numRuns: 20000 },
    );
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        const s = String(x);
        const v = read(s);
        if (v !== SLOW) expect(Object.is(v, Number(s))).toBe(true);
      }),
      { numRuns: 20000 },
    );
  });
  test('answers the common cases and defers the rest', () => {
    expect(read('61.5')).toBe(61.5);
    expect(read(' -0.125 ')).toBe(-0.125);
    expect(read('1e3')).toBe(1000);
    expect(read('')).toBe(MISSING);
    for (const s of ['NA', '.', '0x1A', 'Infinity', '1,5', '12345678901234567', '1e400', 'TRUE']) expect(read(s)).toBe(SLOW);
  });
});
