// The quote-free fast path of src/input/csv.ts against Papa Parse (a registry CSV parser) on random texts.
import fc from 'fast-check';
import Papa from 'papaparse';
import { parseCsv } from '../../src/input/csv';
import { CutlineError } from '../../src/engine/errors';

function cells(text: string): string[][] {
  const t = parseCsv(text);
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
        while (papa.length && papa[papa.length - 1].length === 1 && papa[papa.length - 1][0] === '') papa.pop();
        const ours = cells(text);
        // Papa keeps header cells untrimmed; ours are trimmed.
        expect(ours.slice(1).map((r) => r.join('\u0001'))).toEqual(
          papa.slice(1).map((r) => (r.length === 1 && w > 1 ? header.map(() => '') : r).join('\u0001')),
        );
      }),
      { numRuns: 200 },
    );
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
