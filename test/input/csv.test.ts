// The quote-free fast path of src/input/csv.ts against Papa Parse (a registry CSV parser) on random texts.
import fc from 'fast-check';
import Papa from 'papaparse';
import { CsvReader, parseCsv } from '../../src/input/csv';
import { CutlineError } from '../../src/engine/errors';
import { numericColumn } from '../../src/input/columns';

function cells(text: string, reader?: CsvReader): string[][] {
  const t = parseCsv(text, 'the CSV file', reader);
  const out = [t.header];
  for (let r = 0; r < t.rowCount; r++) out.push(t.header.map((_, c) => String(t.get(r, c))));
  return out;
}

describe('parseCsv', () => {
  test('fast path equals Papa Parse on quote-free texts (source: papaparse 5.7)', () => {
    const field = fc.stringMatching(/^[a-z0-9 .\-]{0,6}$/);
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 5 }), fc.array(fc.array(field, { minLength: 5, maxLength: 5 }), { minLength: 1, maxLength: 20 }), fc.boolean(), (w, rows, crlf) => {
        const header = Array.from({ length: w }, (_, i) => `c${i}`);
        const body = rows.map((r) => r.slice(0, w));
        if (body.every((r) => r.every((c) => c.trim() === '')) && w === 1) return; // all-blank single column: ambiguous
        const eol = crlf ? '\r\n' : '\n';
        const text = [header, ...body].map((r) => r.join(',')).join(eol) + eol;
        const papa = Papa.parse<string[]>(text, { delimiter: ',', skipEmptyLines: false }).data;
        // Blank rows at the end are ignored (README "Input").
        while (papa.length > 1 && papa[papa.length - 1].every((c) => c.trim() === '')) papa.pop();
        if (papa.length === 1) return; // header only: an error in both readers (tested below)
        const ours = cells(text);
        // Papa keeps header cells untrimmed; ours are trimmed.
        expect(ours.slice(1).map((r) => r.join('\u0001'))).toEqual(
          papa.slice(1).map((r) => (r.length === 1 && w > 1 ? header.map(() => '') : r).join('\u0001')),
        );
      }),
      { numRuns: 200 },
    );
  });

  test('the two readers agree on blanks, whitespace and every line ending (property)', () => {
    // Fields of digits, words, markers and blank-looking characters (space, tab, NBSP, ideographic space).
    const field = fc.stringMatching(/^[a-z0-9 .\-\t\u00a0\u3000]{0,5}$/);
    const eol = fc.constantFrom('\n', '\r\n', '\r');
    const line = fc.oneof(
      { weight: 4, arbitrary: fc.array(field, { minLength: 1, maxLength: 4 }) },
      { weight: 1, arbitrary: fc.stringMatching(/^[ \t\u00a0]{0,4}$/).map((b) => [b]) },
    );
    const outcome = (text: string, reader: CsvReader): string => {
      try {
        return JSON.stringify(cells(text, reader));
      } catch (e) {
        if (!(e instanceof CutlineError)) throw e;
        return `error: ${e.message}`;
      }
    };
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 4 }), fc.array(line, { minLength: 0, maxLength: 12 }), fc.array(eol, { minLength: 13, maxLength: 13 }), fc.boolean(), fc.constantFrom(',', ';'), (w, body, eols, final, delim) => {
        // A one-column header holds no delimiter, so the comma is assumed there.
        const d = w === 1 ? ',' : delim;
        const header = Array.from({ length: w }, (_, i) => `c${i}`).join(d);
        const lines = [header, ...body.map((r) => r.join(d))];
        const text = lines.map((l, i) => l + (i < lines.length - 1 || final ? eols[i] : '')).join('');
        expect(outcome(text, 'plain')).toBe(outcome(text, 'quoted'));
      }),
      { numRuns: 1000 },
    );
  });

  test('line endings: CR only (classic Mac), CR LF and LF read alike', () => {
    for (const eol of ['\r', '\r\n', '\n']) {
      const t = parseCsv(`a,b${eol}1,2${eol}3,4${eol}`);
      expect(t.rowCount).toBe(2);
      expect([t.get(1, 0), t.get(1, 1)]).toEqual(['3', '4']);
    }
  });

  test('a semicolon file whose quoted header holds a comma', () => {
    const t = parseCsv('"cost, in euros";"score"\n12,5;61\n');
    expect(t.header).toEqual(['cost, in euros', 'score']);
    expect(t.get(0, 0)).toBe('12,5');
  });

  test('lines of spaces or non-breaking spaces are blank lines in both readers', () => {
    for (const reader of ['plain', 'quoted'] as const) {
      const t = parseCsv('a,b\n1,2\n   \n\u00a0\t\n3,4\n  \n', 'f', reader);
      expect(t.rowCount).toBe(4);
      expect([t.get(1, 0), t.get(2, 1), t.get(3, 0)]).toEqual(['', '', '3']);
    }
  });

  test('UTF-16 text is refused with a hint to save as UTF-8', () => {
    for (const text of ['\ufeffa,b\n1,2\n', 'a,b\n1,2\n']) {
      expect(() => parseCsv(new Uint8Array(Buffer.from(text, 'utf16le')))).toThrow(/UTF-16.*save it again as UTF-8/);
    }
  });

  test('quoted fields go through Papa Parse', () => {
    const t = parseCsv('name,score\n"Oak, Street",61.5\n"say ""hi""",59\n');
    expect(t.rowCount).toBe(2);
    expect(t.get(0, 0)).toBe('Oak, Street');
    expect(t.get(1, 0)).toBe('say "hi"');
    expect(t.get(0, 1)).toBe('61.5');
  });

  test('semicolon files, BOM and CRLF', () => {
    const t = parseCsv('\ufeffa;b\r\n1;2\r\n3;4\r\n');
    expect(t.header).toEqual(['a', 'b']);
    expect([t.get(1, 0), t.get(1, 1)]).toEqual(['3', '4']);
  });

  test('errors', () => {
    expect(() => parseCsv('')).toThrow(CutlineError);
    expect(() => parseCsv('')).toThrow('is empty');
    expect(() => parseCsv('a,b\n')).toThrow('no data rows');
    expect(() => parseCsv('a,b\n1,2\n3\n')).toThrow('row 3: 1 field where the header has 2');
  });

  test('a blank line in the middle is a row of empty cells', () => {
    const t = parseCsv('a,b\n1,2\n\n3,4\n');
    expect(t.rowCount).toBe(3);
    expect([t.get(1, 0), t.get(1, 1)]).toEqual(['', '']);
  });
});

test('a comma file with extra fields gets the decimal-comma hint', () => {
  for (const reader of ['plain', 'quoted'] as const) {
    expect(() => parseCsv('a,b\n1,5,2\n', 'f', reader)).toThrow('f, row 2: 3 fields where the header has 2; if the file writes numbers with a decimal comma (3,5)');
  }
  expect(() => parseCsv('a;b\n1;5;2\n')).toThrow(/where the header has 2$/);
});

describe('numbers read during the scan (plainCsv.ts)', () => {
  // Reference: the general cell rules (cells.ts, built on ECMAScript Number()) through the quoted reader,
  // which reads every cell one at a time; the scan must give the same double, mask and first error.
  const numberText = fc.oneof(
    fc.double({ noNaN: true, noDefaultInfinity: true }).map((x) => String(x)),
    fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((x) => x.toFixed(6)),
    fc.stringMatching(/^[+-]?[0-9]{0,18}(\.[0-9]{0,18})?$/),
    fc.stringMatching(/^[+-]?0{0,6}\.?0{0,6}[0-9]{1,4}([eE][+-]?[0-9]{1,3})?$/),
    fc.constantFrom('', ' ', ' 7 ', '\t-3.5', 'NA', '.', '-', '+', '-0', '0.', '.5', '1e400', '\u00a012', 'x'),
  );
  const read = (text: string, reader: CsvReader, hint: boolean): string => {
    try {
      const t = parseCsv(text, 'the CSV file', reader, hint ? () => [0, 2] : undefined);
      const a = numericColumn(t, 'a', 'outcome');
      const b = numericColumn(t, 'b', 'outcome');
      const c = numericColumn(t, 'c', 'outcome');
      // Object.is keeps −0 apart from 0.
      const show = (col: { values: Float64Array; missing: Uint8Array }) => Array.from(col.values, (v, r) => (col.missing[r] ? 'missing' : Object.is(v, -0) ? '-0' : String(v)));
      return JSON.stringify([show(a), show(b), show(c)]);
    } catch (e) {
      if (!(e instanceof CutlineError)) throw e;
      return `error: ${e.message}`;
    }
  };
  test('equal the cell rules on random numbers, blanks and words (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.array(numberText, { minLength: 3, maxLength: 3 }), { minLength: 1, maxLength: 15 }), fc.constantFrom('\n', '\r\n', '\r'), (rows, eol) => {
        const text = ['a,b,c', ...rows.map((r) => r.join(','))].join(eol) + eol;
        const reference = read(text, 'quoted', false);
        expect(read(text, 'plain', true)).toBe(reference);
        expect(read(text, 'plain', false)).toBe(reference);
      }),
      { numRuns: 1000 },
    );
  });

  test('a blank line and a wrong-width blank line inside numbers', () => {
    const text = 'a,b,c\n1,2,3\n\n4,5,6\n , ,\n';
    const t = parseCsv(text, 'the CSV file', 'plain', () => [0, 1, 2]);
    expect(t.rowCount).toBe(3);
    const a = numericColumn(t, 'a', 'outcome');
    expect(Array.from(a.values)).toEqual([1, 0, 4]);
    expect(Array.from(a.missing)).toEqual([0, 1, 0]);
  });
});

test('the scan grows its room when the first lines foretell too few rows', () => {
  // 64 KiB of long lines first (a wide text column), then 30,000 short ones: the estimate from the first 64 KiB
  // is far too small, so the buffers double several times; every number must still equal the cell rules.
  const long = Array.from({ length: 200 }, (_, i) => `${i * 0.5},${'x'.repeat(400)},${i}`);
  const short = Array.from({ length: 30000 }, (_, i) => `${(i % 97) / 8},,${-i}`);
  const text = ['a,b,c', ...long, ...short].join('\n') + '\n';
  const fast = parseCsv(text, 'the CSV file', 'plain', () => [0, 2]);
  const slow = parseCsv(text, 'the CSV file', 'quoted');
  expect(fast.rowCount).toBe(30200);
  for (const name of ['a', 'c']) {
    const f = numericColumn(fast, name, 'outcome');
    const s = numericColumn(slow, name, 'outcome');
    expect(Array.from(f.values)).toEqual(Array.from(s.values));
    expect(Array.from(f.missing)).toEqual(Array.from(s.missing));
  }
  expect(numericColumn(fast, 'c', 'outcome').values[30199]).toBe(-29999);
});
