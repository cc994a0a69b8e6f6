/**
 * Issue 9 end to end: the families of real files and real mistakes, each
 * through the built command (bin/cutline.cjs). Expectations come from the
 * contract (README "Input", "Estimates"): blank-looking cells are missing,
 * every line ending and delimiter reads alike, errors name the column or
 * option and a remedy. Effects are compared with the same design written
 * plainly (same rows, so the same estimate to the last digit).
 */
import { spawnSync } from 'child_process';
import ExcelJS from 'exceljs';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';

const root = path.resolve(__dirname, '..', '..');
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-i9-'));

interface Run {
  code: number | null;
  out: string;
  err: string;
}
function run(args: string[]): Run {
  const r = spawnSync(process.execPath, [path.join(root, 'bin/cutline.cjs'), ...args], { encoding: 'utf8', cwd: root, timeout: 60000 });
  return { code: r.status, out: r.stdout, err: r.stderr };
}
function write(name: string, text: string | Buffer): string {
  const p = path.join(dir, name);
  fs.writeFileSync(p, text);
  return p;
}
interface Row {
  i: number;
  r: number;
  d: number;
  y: number;
}
/** The deterministic fuzzy design of test/cli/cli.test.ts: take-up 0.2 → 0.7 at 0, effect 2. */
function rows(n = 400): Row[] {
  return Array.from({ length: n }, (_, i) => {
    const r = -1 + (2 * (i + 0.5)) / n;
    const u = ((i * 7919) % 1000) / 1000;
    const d = u < (r >= 0 ? 0.7 : 0.2) ? 1 : 0;
    return { i, r, d, y: 1 + r + 2 * d + Math.sin(i * 1.7) * 0.3 };
  });
}
const f5 = (v: number): string => v.toFixed(5);
function csv(header: string, line: (row: Row) => string, eol = '\n', data = rows()): string {
  return [header, ...data.map(line)].join(eol) + eol;
}
const plain = (o: Row): string => `${f5(o.r)},${o.d},${f5(o.y)}`;
const opts = (...extra: string[]): string[] => ['--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0', '--draws', '99', '--sensitivity', 'off', ...extra];
const check = (file: string, ...extra: string[]): Run => run(['check', file, ...opts(...extra)]);

function refused(r: Run, message: RegExp): void {
  expect({ code: r.code, out: r.out }).toEqual({ code: 2, out: '' });
  expect(r.err.trim().split('\n')).toHaveLength(1);
  expect(r.err).not.toMatch(/internal error|\n\s+at /);
  expect(r.err).toMatch(message);
}
// eslint-disable-next-line @typescript-eslint/no-explicit-any
function json(r: Run): any {
  expect({ code: r.code, err: r.err }).toEqual({ code: 0, err: '' });
  return JSON.parse(r.out);
}

const good = write('good.csv', csv('score,treated,y', plain));
let reference: { effect: number; used: number };
beforeAll(() => {
  const j = json(check(good, '--json'));
  reference = { effect: j.outcomes[0].effect.estimate, used: j.rows.used };
});

describe('1. blank-looking cells are missing', () => {
  test('NBSP, ideographic space, a quoted line break in the treated column drop the row (never 0)', () => {
    const blanks = ['\u00a0', '\u3000', '"\n"', '"\r\n"', ' \u2003 '];
    const text = csv('score,treated,y', (o) => (o.i < blanks.length ? `${f5(o.r)},${blanks[o.i]},${f5(o.y)}` : plain(o)));
    const j = json(check(write('blanks.csv', text), '--json'));
    expect(j.rows).toEqual({ read: 400, used: 400 - blanks.length, dropped: blanks.length });
    // The same as deleting those rows' treated values by hand.
    const empty = csv('score,treated,y', (o) => (o.i < blanks.length ? `${f5(o.r)},,${f5(o.y)}` : plain(o)));
    expect(j.outcomes[0].effect.estimate).toBe(json(check(write('empty.csv', empty), '--json')).outcomes[0].effect.estimate);
  });
  test('hexadecimal behind a non-breaking space is refused, naming column and row', () => {
    const text = csv('score,treated,y', (o) => (o.i === 3 ? `${f5(o.r)},${o.d},\u00a00x10` : plain(o)));
    refused(check(write('hex.csv', text)), /column "y" \(outcome\), row 5: not a number, found ".0x10"/);
  });
  test('an XLSX cell holding only a line break (Alt+Enter) or an NBSP is missing', async () => {
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('data');
    ws.addRow(['score', 'treated', 'y']);
    for (const o of rows()) ws.addRow([o.r, o.i === 0 ? '\n' : o.i === 1 ? '\u00a0' : o.d, o.y]);
    const p = path.join(dir, 'blank.xlsx');
    await wb.xlsx.writeFile(p);
    const j = json(check(p, '--json'));
    expect(j.rows.dropped).toBe(2);
  });
});

describe('4. files real programs write', () => {
  test('CR-only, CR LF and LF line endings give the same effect', () => {
    for (const eol of ['\r', '\r\n']) {
      const j = json(check(write(`eol${eol.length}.csv`, csv('score,treated,y', plain, eol)), '--json'));
      expect(j.outcomes[0].effect.estimate).toBe(reference.effect);
    }
  });
  test('a semicolon file whose quoted header holds a comma', () => {
    const text = csv('"score, points";treated;y', (o) => `${f5(o.r)};${o.d};${f5(o.y)}`);
    const r = run(['check', write('semi.csv', text), ...opts('--json').map((a) => (a === 'score' ? 'score, points' : a))]);
    expect(json(r).outcomes[0].effect.estimate).toBe(reference.effect);
  });
  test('lines of spaces are blank rows (dropped and counted), quoted file or not', () => {
    for (const q of ['', '"']) {
      const text = csv(`${q}score${q},treated,y`, (o) => (o.i === 10 ? '   \t ' : plain(o)));
      const j = json(check(write(`spaces${q.length}.csv`, text + '  \n'), '--json'));
      expect(j.rows).toEqual({ read: 400, used: 399, dropped: 1 });
    }
  });
  test('XLSX merged cells: the hidden cells are blank, not copies of the top-left value', async () => {
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('data');
    ws.addRow(['score', 'treated', 'y']);
    for (const o of rows()) ws.addRow([o.r, o.d, o.y]);
    ws.mergeCells('B2:B4'); // rows 3 and 4 of the treated column become blank
    const p = path.join(dir, 'merged.xlsx');
    await wb.xlsx.writeFile(p);
    expect(json(check(p, '--json')).rows.dropped).toBe(2);
  });
  test('a decimal comma gets a hint', () => {
    const text = csv('score;treated;y', (o) => `${f5(o.r)};${o.d};${f5(o.y).replace('.', ',')}`);
    refused(check(write('comma.csv', text)), /column "y" \(outcome\), row 2: not a number, found "[-\d]+,\d+"; it looks like a number written with a decimal comma/);
  });
  test('a UTF-16 file gets a hint to save as UTF-8', () => {
    const p = write('utf16.csv', Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(csv('score,treated,y', plain), 'utf16le')]));
    refused(check(p), /is UTF-16 text.*save it again as UTF-8/);
  });
});

describe('3. errors name the column or option and a remedy', () => {
  test('missing outcome values emptying a side blame the outcome, not the cutoff', () => {
    const text = csv('score,treated,y', (o) => (o.r < 0 ? `${f5(o.r)},${o.d},NA` : plain(o)));
    refused(check(write('emptyside.csv', text)), /no row below the cutoff 0 has a value in every column .*200 miss "y" \(outcome\); fill in the missing values/);
  });
  test('an all-missing column is named', () => {
    const text = csv('score,treated,y', (o) => `${f5(o.r)},${o.d},`);
    refused(check(write('allmissing.csv', text)), /column "y" \(outcome\) is missing on every one of its 400 rows/);
  });
  test('too few distinct scores near the cutoff: plain words, the score and a remedy', () => {
    // Scores on a coarse grid: 2 distinct values on each side within reach of the bandwidth rule.
    const text = csv('score,treated,y', (o) => `${o.r < 0 ? (o.i % 2 ? -1 : -0.5) : o.i % 2 ? 1 : 0.5},${o.d},${f5(o.y)}`);
    const r = check(write('coarse.csv', text));
    expect(r.err).not.toMatch(/pilot/);
    refused(r, /--bandwidth: too few units near the cutoff to choose a bandwidth: within [\d.]+ of it the score has 0 below and 0 above \(0 and 0 distinct scores\).*give a bandwidth wide enough/);
  });
  test('a donut that removes everything near the cutoff names the donut', () => {
    // Units near the cutoff only, then a gap: a donut of 0.9 leaves only the far tails.
    const data = rows().filter((o) => Math.abs(o.r) < 0.2 || Math.abs(o.r) > 0.985);
    const text = csv('score,treated,y', plain, '\n', data);
    const r = check(write('donut.csv', text), '--donut', '0.9');
    expect(r.err).not.toMatch(/pilot/);
    refused(r, /--donut: the donut \(radius 0\.9\) leaves too few units or distinct scores near the cutoff for the bandwidth rule \(it works without the donut\); choose a smaller donut, or give a bandwidth/);
  });
});

describe('5. designs that make no sense', () => {
  const withCov = write('cov.csv', csv('score,treated,y,score_copy,x', (o) => `${plain(o)},${f5(o.r)},${(o.i * 37) % 11}`));
  test.each([
    ['score', /--covariate: column "score" is already given as --score; a covariate must be a characteristic fixed before treatment/],
    ['treated', /is already given as --treated/],
    ['y', /is already given as --outcome/],
    ['score_copy', /column "score_copy" holds the same values as "score" \(--score\) on every row/],
  ])('a covariate %s is refused', (cov, message) => {
    refused(check(withCov, '--covariate', cov), message);
  });
  test('an all-missing covariate is called all-missing, not constant', () => {
    const p = write('covmissing.csv', csv('score,treated,y,x', (o) => `${plain(o)},NA`));
    const j = json(check(p, '--covariate', 'x', '--json'));
    expect(j.balance[0].warnings).toEqual(['x is missing on every row that has a score: there is nothing to test']);
  });
  test('clusters that are the two sides of the cutoff: warned; few clusters: warned', () => {
    const p = write('sidecl.csv', csv('score,treated,y,g', (o) => `${plain(o)},${o.r < 0 ? 'west' : 'east'}`));
    const j = json(check(p, '--cluster', 'g', '--json'));
    expect(j.warnings.join('\n')).toMatch(/below the cutoff all belong to the cluster "west", and those above the cutoff all belong to the cluster "east".*far too small/);
    expect(j.warnings.join('\n')).toMatch(/the window holds only 2 clusters of "g" \(fewer than 20\)/);
    const three = write('three.csv', csv('score,treated,y,g', (o) => `${plain(o)},c${o.i % 3}`));
    const k = json(check(three, '--cluster', 'g', '--json'));
    expect(k.warnings.join('\n')).toMatch(/only 3 clusters/);
    expect(k.warnings.join('\n')).not.toMatch(/all belong to the cluster/);
    const many = write('many.csv', csv('score,treated,y,g', (o) => `${plain(o)},c${o.i % 40}`));
    expect(json(check(many, '--cluster', 'g', '--json')).warnings.join('\n')).not.toMatch(/clusters? of "g"/);
  });
  test('a trim so large it replaces every standard error is warned', () => {
    const j = json(check(good, '--trim', '50', '--json'));
    expect(j.outcomes[0].warnings.join('\n')).toMatch(/the trim 50 is so large that it replaces the standard error of every interval/);
    expect(json(check(good, '--json')).outcomes[0].warnings.join('\n')).not.toMatch(/trim/);
  });
  test('a sensitivity multiple spreading the window over many times the range is refused', () => {
    refused(run(['check', good, '--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0', '--draws', '99', '--sensitivity', '1,5000']),
      /--sensitivity: the sensitivity multiple 5000 makes the validity test's bandwidth [\d.e+]+, more than 10 times the range of the scores .*choose multiples up to/);
  });
});

describe('6. small contract slips', () => {
  test('a flag or a single option given twice is refused', () => {
    refused(check(good, '--json', '--json'), /--json is given twice; give it once/);
    refused(check(good, '--kernel', 'uniform', '--kernel', 'triangular'), /--kernel is given twice \("uniform" and "triangular"\); give it once/);
  });
  test('cutline check --help prints the usage', () => {
    const r = run(['check', '--help']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/^usage: cutline check FILE/);
  });
  test('the list of columns in an error is cut to a sane length', () => {
    const long = 'x'.repeat(100000);
    const p = write('wide.csv', csv(`score,treated,y,${long}`, (o) => `${plain(o)},1`));
    const r = run(['check', p, '--score', 'score', '--treated', 'treated', '--outcome', 'nope', '--cutoff', '0']);
    refused(r, /--outcome: no column named "nope"; the columns are "score", "treated", "y", "x{37}…"/);
    expect(r.err.length).toBeLessThan(300);
  });
  test('warnings are in plain words', () => {
    const j = json(check(good, '--cluster', 'treated', '--json'));
    const all = JSON.stringify(j);
    expect(all).not.toMatch(/n\^\(|pilot bandwidth|bias correction's quadratic fit|METHODS/);
  });
});
