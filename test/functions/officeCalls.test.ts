// Every Office API call of the functions layer, made against office-addin-mock
// objects: the runtime's CustomFunctions (associate, Error, ErrorCode — the
// bundle test covers associate) and the invocation's parameterAddresses and
// onCanceled. A scan of the sources keeps this list complete: any other use
// of an Office API in src/functions fails the first test.
import * as fs from 'fs';
import * as path from 'path';
import { OfficeMockObject } from 'office-addin-mock';
import { CutlineError } from '../../src/engine';
import { excelError, toExcelError } from '../../src/functions/excelError';
import { single } from '../../src/functions/call';
import { RangeInputError } from '../../src/input/range';
import { ERROR_CODES, MockExcelError } from '../helpers/functionsBundle';

const dir = path.resolve(__dirname, '..', '..', 'src', 'functions');
const sources = fs.readdirSync(dir).map((f) => fs.readFileSync(path.join(dir, f), 'utf8'));

beforeAll(() => {
  const runtime = new OfficeMockObject({ Error: MockExcelError }) as OfficeMockObject & Record<string, unknown>;
  runtime.ErrorCode = ERROR_CODES;
  (globalThis as Record<string, unknown>).CustomFunctions = runtime;
});

test('the functions layer uses CustomFunctions.Error/ErrorCode and the invocation, and no other Office API', () => {
  const used = new Set(sources.flatMap((s) => [...s.matchAll(/\bCustomFunctions\.(\w+)/g)].map((m) => m[1])));
  // associate: named in functions.ts, whose calls the build appends (the bundle test counts them).
  expect([...used].sort()).toEqual(['CancelableInvocation', 'Error', 'ErrorCode', 'Invocation', 'associate']);
  for (const s of sources) {
    expect(s).not.toMatch(/\b(Excel|Office|OfficeExtension)\.\w/);
    const members = [...s.matchAll(/\binvocation\??\.(\w+)/g)].map((m) => m[1]);
    for (const m of members) expect(['parameterAddresses', 'onCanceled']).toContain(m);
  }
});

test('Excel errors are built by the runtime: #VALUE! and #N/A with a message, #NUM! without (Excel shows none)', () => {
  const v = excelError('#VALUE!', 'm1') as unknown as MockExcelError;
  expect(v).toBeInstanceOf(MockExcelError);
  expect([v.code, v.message]).toEqual(['#VALUE!', 'm1']);
  const n = excelError('#N/A', 'm2') as unknown as MockExcelError;
  expect([n.code, n.message]).toEqual(['#N/A', 'm2']);
  const num = excelError('#NUM!', 'ignored') as unknown as MockExcelError;
  expect([num.code, num.message]).toEqual(['#NUM!', undefined]);
});

test('which error for which problem', () => {
  const e = (x: unknown) => toExcelError('EFFECT', x) as unknown as MockExcelError;
  expect(e(new RangeInputError('score: row 2 of the range is not a number; it holds "x"', 'score'))).toEqual(
    new MockExcelError('#VALUE!', 'CUTLINE.EFFECT: score: row 2 of the range is not a number; it holds "x"'),
  );
  const option = Object.assign(new CutlineError('kernel must be one of …'), { code: 'option', argument: 'kernel' });
  expect(e(option).code).toBe('#VALUE!');
  const data = Object.assign(new CutlineError('no unit has a score below the cutoff 0'), { code: 'empty-side', argument: 'cutoff' });
  expect(e(data)).toEqual(new MockExcelError('#N/A', 'CUTLINE.EFFECT: cutoff: no unit has a score below the cutoff 0'));
  // A bug is not dressed up as the user's mistake, and shows no stack trace.
  const bug = e(new TypeError('x is undefined'));
  expect(bug.code).toBe('#N/A');
  expect(bug.message).toBe('CUTLINE.EFFECT could not compute this (x is undefined); please report it with the data that cause it');
  // The code decides, not the wording: "must be" in a finding about the data is still #N/A, and an
  // option error in words without "must be" is still #VALUE!.
  expect(e(new CutlineError('the window must be wider: 2 units above the cutoff', { code: 'too-few', argument: 'bandwidth' })).code).toBe('#N/A');
  expect(e(new CutlineError('the score is constant; got one value'))).toEqual(new MockExcelError('#N/A', 'CUTLINE.EFFECT: the score is constant; got one value'));
  expect(e(new CutlineError('unknown kernel "gaussian"', { code: 'option', argument: 'kernel' }))).toEqual(
    new MockExcelError('#VALUE!', 'CUTLINE.EFFECT: kernel: unknown kernel "gaussian"'),
  );
  expect(e(new CutlineError('score is not a number at row 3', { code: 'bad-value', argument: 'score', index: 2 })).code).toBe('#VALUE!');
  const own = excelError('#N/A', 'CUTLINE.VALIDITY: the test does not apply: …');
  expect(toExcelError('VALIDITY', own)).toBe(own);
  expect(() => single('EFFECT', Infinity)).toThrow(MockExcelError);
  expect(single('EFFECT', 2.5)).toEqual([[2.5]]);
});
