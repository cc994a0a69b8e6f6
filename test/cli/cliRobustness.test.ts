// Adversarial audit of `cutline check` (DESIGN.md "The command line", METHODS.md §1): bad input
// exits 2 with exactly one line on stderr naming the argument or column (and the first bad row);
// never exit 1, a stack trace or a silent NaN (JSON.stringify turns NaN into null, so no null may
// appear); the input file is never changed. Expected values are Cutline's own invariances
// (the same data in another file format, a mirrored score), not outside numbers.
import { spawnSync } from 'child_process';
import * as crypto from 'crypto';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import ExcelJS from 'exceljs';

const root = path.resolve(__dirname, '..', '..');
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-robust-'));
const hashes = new Map<string, string>();
const hash = (p: string): string => crypto.createHash('sha256').update(fs.readFileSync(p)).digest('hex');

interface Run {
  code: number | null;
  out: string;
  err: string;
}

function run(args: string[]): Run {
  const r = spawnSync(process.execPath, [path.join(root, 'bin/cutline.cjs'), 'check', ...args], { encoding: 'utf8', cwd: root, timeout: 60000 });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

function write(name: string, text: string | Buffer): string {
  const p = path.join(dir, name);
  fs.writeFileSync(p, text);
  hashes.set(p, hash(p));
  return p;
}

interface Row {
  i: number;
  r: number;
  d: number;
  y: number;
}
/** The deterministic fuzzy design of test/cli.test.ts: take-up 0.2 → 0.7 at 0, effect 2. */
function rows(n = 400, up = 0.7, low = 0.2): Row[] {
  return Array.from({ length: n }, (_, i) => {
    const r = -1 + (2 * (i + 0.5)) / n;
    const u = ((i * 7919) % 1000) / 1000;
    const d = u < (r >= 0 ? up : low) ? 1 : 0;
    return { i, r, d, y: 1 + r + 2 * d + Math.sin(i * 1.7) * 0.3 };
  });
}
const f5 = (v: number): string => v.toFixed(5);
function csv(header: string, line: (row: Row) => string, data = rows(), eol = '\n'): string {
  return [header, ...data.map(line)].join(eol) + eol;
}
const plain = (o: Row): string => `${f5(o.r)},${o.d},${f5(o.y)}`;

const opts = (...extra: string[]): string[] => ['--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0', '--draws', '99', ...extra];

/** Paths of every null (a NaN or ±Infinity once stringified) in a JSON value. */
function nulls(v: unknown, at = '$'): string[] {
  if (v === null) return [at];
  if (Array.isArray(v)) return v.flatMap((x, k) => nulls(x, `${at}[${k}]`));
  if (typeof v === 'object') return Object.entries(v as object).flatMap(([k, x]) => nulls(x, `${at}.${k}`));
  return [];
}

function expectRefused(r: Run, message: RegExp): void {
  expect({ code: r.code, err: r.err }).toMatchObject({ code: 2 });
  expect(r.out).toBe('');
  expect(r.err.trim().split('\n')).toHaveLength(1);
  expect(r.err).not.toMatch(/internal error|\n\s+at /);
  expect(r.err).toMatch(message);
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function expectJson(r: Run): any {
  expect({ code: r.code, err: r.err }).toEqual({ code: 0, err: '' });
  const j = JSON.parse(r.out);
  expect(nulls(j)).toEqual([]);
  return j;
}

const good = write('good.csv', csv('score,treated,y,age', (o) => `${plain(o)},${30 + (o.i % 17)}`));
let reference: { effect: number; jump: number; takeup: number };

beforeAll(() => {
  const j = expectJson(run([good, ...opts('--json')]));
  reference = { effect: j.outcomes[0].effect.estimate, jump: j.outcomes[0].jump.estimate, takeup: j.takeup.estimate };
});

afterAll(() => {
  // Every input file is only read.
  for (const [p, h] of hashes) if (fs.existsSync(p) && fs.statSync(p).isFile()) expect(hash(p)).toBe(h);
});

describe('options', () => {
  const valued = ['score', 'treated', 'outcome', 'cutoff', 'sheet', 'bandwidth', 'bandwidth-rule', 'kernel', 'variance', 'draws', 'seed', 'grid', 'trim',
    'multiplier', 'sensitivity', 'within', 'density-bin', 'density-bandwidth', 'covariate', 'cluster', 'donut'];
  test.each(valued)('--%s with no value, last or before another option', (name) => {
    expectRefused(run([good, ...opts(`--${name}`)]), new RegExp(`--${name} needs a value`));
    expectRefused(run([good, `--${name}`, '--json', ...opts()]), new RegExp(`--${name} needs a value`));
  });

  const numeric = ['bandwidth', 'draws', 'seed', 'grid', 'trim', 'density-bin', 'density-bandwidth', 'donut'];
  const notNumbers = ['abc', '', 'Infinity', 'NaN', '0x10', '0b11', '1,5', '--'];
  test.each(numeric)('--%s that is not a decimal number', (name) => {
    for (const v of notNumbers) {
      const args = [good, ...opts().filter((a, k, all) => !(a === '--draws' || all[k - 1] === '--draws')), `--${name}=${v}`];
      expectRefused(run(args), new RegExp(`--${name} must be a number, got ${JSON.stringify(JSON.stringify(v)).slice(1, -1)}`));
    }
  });

  const outOfRange: Array<[string, string, RegExp]> = [
    ['bandwidth', '0', /--bandwidth must be positive, got 0/],
    ['bandwidth', '-1', /--bandwidth must be positive, got -1/],
    ['draws', '2.5', /--draws must be a whole number of at least 1/],
    ['draws', '1e300', /--draws must be at most 100000 .*got 1e300/],
    ['draws', '1e9', /--draws must be at most 100000/],
    ['seed', '-1', /--seed must be a whole number from 0 to 4294967295/],
    ['seed', '4294967296', /--seed must be a whole number from 0 to 4294967295/],
    ['grid', '0', /--grid must be a whole number of at least 2/],
    ['grid', '1e300', /--grid must be at most 1000/],
    ['trim', '-1', /--trim must be at least 0/],
    ['density-bin', '0', /--density-bin must be positive/],
    ['density-bin', '-0.1', /--density-bin must be positive/],
    ['density-bin', '1e300', /bin width 1e\+300 is larger than the range of the score/],
    ['density-bandwidth', '0', /--density-bandwidth must be positive/],
    ['density-bandwidth', '1e300', /density bandwidth 1e\+300 is wider than the largest distance of a score from the cutoff \(0\.9975\)/],
    ['donut', '0', /--donut must be positive/],
    ['donut', '-2', /--donut must be positive/],
    ['donut', '1e300', /--donut: the donut 1e\+300 leaves no unit below the cutoff/],
  ];
  test.each(outOfRange)('--%s %s is refused with a clear message', (name, value, message) => {
    const base = name === 'draws' ? opts().slice(0, -2) : opts();
    expectRefused(run([good, ...base, `--${name}`, value]), message);
  });

  test('a huge typed bandwidth is refused by name, not blamed on too few distinct scores', () => {
    for (const v of ['1e300', '1e6', '1000']) {
      expectRefused(run([good, ...opts('--bandwidth', v)]), /^cutline: --bandwidth: the bandwidth \S+ is more than 10 times the largest distance of a score from the cutoff \(0\.9975\)/);
    }
    // Up to that limit every unit is in the window and the numbers stay finite.
    const j = expectJson(run([good, ...opts('--bandwidth', '9', '--json')]));
    expect(j.bandwidth.window).toEqual({ below: 200, above: 200 });
  });

  test('huge but harmless values: --trim 1e300, the largest seed, --density-bandwidth inside the data', () => {
    const t = expectJson(run([good, ...opts('--trim', '1e300', '--json')]));
    expect(t.outcomes[0].validity.statistic).toBeLessThan(1e-290); // every moment divided by the floor
    expect(t.outcomes[0].validity.pvalue).toBeGreaterThan(0);
    expectJson(run([good, ...opts('--seed', '4294967295', '--json')]));
    expect(expectJson(run([good, ...opts('--density-bandwidth', '0.99', '--json')])).density.mccrary.bandwidth).toBe(0.99);
  });

  test('the cutoff at the smallest or largest score, or outside the data', () => {
    const at = (c: string): string[] => [good, '--score', 'score', '--treated', 'treated', '--outcome', 'y', '--draws', '99', '--cutoff', c];
    expectRefused(run(at('-0.9975')), /--cutoff: no unit has a score below the cutoff -0\.9975/);
    expectRefused(run(at('1e300')), /--cutoff: no unit has a score at or above the cutoff 1e\+300/);
    expectRefused(run(at('-1e300')), /--cutoff: no unit has a score below the cutoff/);
    // One unit at the largest score: too few above, said with the counts.
    expectRefused(run(at('0.9975')), /too few units near the cutoff .*1 above/);
    expectRefused(run(at('0.99')), /holds 2 units above the cutoff; at least 3 are needed/);
  });

  test('options that contradict each other or name nothing', () => {
    expectRefused(run([good, ...opts('--bandwidth', '0.5', '--bandwidth-rule', 'ik')]), /give --bandwidth or --bandwidth-rule, not both/);
    expectRefused(run([good, ...opts('--variance', 'cluster')]), /--variance cluster needs --cluster COL/);
    expectRefused(run([good, ...opts('--cluster=')]), /--cluster needs a column name/);
    expectRefused(run([good, ...opts('--within', ' ')]), /--within needs a column name/);
    expectRefused(run([good, ...opts('--covariate=')]), /--covariate needs a column name/);
    expectRefused(run([good, ...opts('--outcome', 'y')]), /--outcome: column "y" is already given as --outcome/);
    expectRefused(run([good, ...opts('--outcome', 'treated')]), /--outcome: column "treated" is already given as --treated/);
    expectRefused(run([good, ...opts('--covariate', 'age', '--covariate', 'age')]), /--covariate: column "age" is given twice/);
    expectRefused(run([good, ...opts('--sheet', 'data')]), /--sheet applies to XLSX workbooks/);
    expectRefused(run([good, ...opts('--cutoff', '1')]), /--cutoff is given twice/);
  });
});

describe('headers and CSV dialects', () => {
  test('a column name the header holds twice is refused, not silently the first', () => {
    const f = write('dup.csv', csv('score,treated,y,y', (o) => `${plain(o)},${f5(o.y + 1)}`));
    expectRefused(run([f, ...opts()]), /--outcome: the header has 2 columns named "y" \(columns 3, 4\)/);
    const g = write('dupcase.csv', csv('score,treated,y,Y', (o) => `${plain(o)},${f5(o.y + 1)}`));
    expect(expectJson(run([g, ...opts('--json')])).outcomes[0].effect.estimate).toBeCloseTo(reference.effect, 12); // exact match wins
  });

  test('empty header names are fine until one is asked for', () => {
    const f = write('blankname.csv', csv('score,treated,y,,', (o) => `${plain(o)},${o.i},${o.i % 3}`));
    expect(expectJson(run([f, ...opts('--json')])).outcomes[0].effect.estimate).toBeCloseTo(reference.effect, 12);
    expectRefused(run([f, ...opts('--covariate', '')]), /--covariate needs a column name, got an empty one/);
  });

  test('names with spaces, quotes and non-ASCII letters', () => {
    const f = write('names.csv', csv('"my score","treated ""D""",bill €,Größe', (o) => `${plain(o)},${o.i % 5}`));
    const j = expectJson(run([f, '--score', 'my score', '--treated', 'treated "D"', '--outcome', 'bill €', '--covariate', 'Größe', '--cutoff', '0', '--draws', '99', '--json']));
    expect(j.outcomes[0].name).toBe('bill €');
    expect(j.balance[0].name).toBe('Größe');
    expect(j.outcomes[0].effect.estimate).toBeCloseTo(reference.effect, 12);
  });

  test.each([
    ['quoted fields with embedded newlines', 'quoted.csv', () => csv('score,treated,y,note', (o) => `"${f5(o.r)}",${o.d},"${f5(o.y)}","line one\nline, two ${o.i}"`)],
    ['semicolons', 'semi.csv', () => csv('score;treated;y', (o) => plain(o).replace(/,/g, ';'))],
    ['CR LF line ends', 'crlf.csv', () => csv('score,treated,y', plain, rows(), '\r\n')],
    ['a byte-order mark and CR LF', 'bom.csv', () => '\ufeff' + csv('score,treated,y', plain, rows(), '\r\n')],
  ])('%s give the same numbers as plain CSV', (_n, name, text) => {
    const j = expectJson(run([write(name, text()), ...opts('--json')]));
    expect(j.rows).toEqual({ read: 400, used: 400, dropped: 0 });
    expect(j.outcomes[0].effect.estimate).toBeCloseTo(reference.effect, 12);
  });

  test('decimal commas in a semicolon CSV name the column and the first row', () => {
    const f = write('semicomma.csv', csv('score;treated;y', (o) => `${f5(o.r).replace('.', ',')};${o.d};${f5(o.y).replace('.', ',')}`));
    expectRefused(run([f, ...opts()]), /column "score" \(score\), row 2: not a number, found "-0,99750"/);
  });
});

describe('designs at the edges', () => {
  test('one row per side, and too few rows', () => {
    expectRefused(run([write('tworows.csv', 'score,treated,y\n-1,0,1\n1,1,3\n'), ...opts()]), /too few units near the cutoff to choose a bandwidth: within [\d.]+ of it the score has 1 below and 1 above \(1 and 1 distinct scores\).*give a bandwidth/);
    expectRefused(run([write('six.csv', 'score,treated,y\n-1,0,1\n-0.5,1,2\n-0.2,0,1.5\n0.1,1,3\n0.4,0,2\n0.9,1,4\n'), ...opts()]), /at least 3 are needed/);
  });

  const sharp = (): string => write('sharp.csv', csv('score,treated,y', plain, rows(400, 1.01, -1)));
  test('sharp design (typed bandwidth): take-up 1, effect = jump, the validity test is not applicable', () => {
    // Before issue 7 the test ran here with a power warning; METHODS §4 (arms that test nothing) now gives no p-value.
    const j = expectJson(run([sharp(), ...opts('--bandwidth', '0.5', '--json')]));
    expect(j.takeup.estimate).toBeCloseTo(1, 12);
    expect(j.outcomes[0].effect.estimate).toBeCloseTo(j.outcomes[0].jump.estimate, 12);
    expect(Object.keys(j.outcomes[0].validity).sort()).toEqual(['applicable', 'reason']);
    expect(j.outcomes[0].validity.applicable).toBe(false);
    expect(j.outcomes[0].validity.reason).toMatch(/the design is sharp in this window/);
  });
  // Bug left for the lead (src/engine/check/check.ts + bandwidthMse.ts): the validity test's bandwidth is the
  // mse of take-up, whose pilot b is 0 when take-up is constant on each side; the user sees
  // "bandwidth must be a positive number, got 0" for a bandwidth they never typed.
  test('sharp design (default rule) runs, or names the problem', () => {
    const r = run([sharp(), ...opts('--json')]);
    if (r.code === 2) expect(r.err).not.toMatch(/bandwidth must be a positive number, got 0/);
    else expectJson(r);
    expect(r.code).toBe(0);
  });

  test('take-up falling at the cutoff: eligibility below, said so, and the mirror image of a rising design', () => {
    const data = rows(400, 0.2, 0.7);
    const falling = expectJson(run([write('falling.csv', csv('score,treated,y', plain, data)), ...opts('--bandwidth', '0.5', '--json')]));
    const mirrored = data.map((o) => ({ ...o, r: -o.r })).reverse();
    const rising = expectJson(run([write('mirror.csv', csv('score,treated,y', plain, mirrored)), ...opts('--bandwidth', '0.5', '--json')]));
    expect(falling.eligible).toBe('below');
    expect(rising.eligible).toBe('above');
    expect(falling.warnings.join(' ')).toMatch(/take-up falls at the cutoff: eligibility is taken to be below the cutoff, and every jump is reported as below minus above/);
    expect(falling.takeup.estimate).toBeGreaterThan(0);
    for (const k of ['jump', 'effect']) expect(falling.outcomes[0][k].estimate).toBeCloseTo(rising.outcomes[0][k].estimate, 10);
    expect(falling.takeup.estimate).toBeCloseTo(rising.takeup.estimate, 10);
    expect(falling.outcomes[0].validity.statistic).toBeCloseTo(rising.outcomes[0].validity.statistic, 10);
  });

  test.each([
    ['binary outcome', (o: Row) => ((o.i * 31) % 100 < 30 + 30 * o.d ? '1' : '0'), [0, 1]],
    ['outcome with two values', (o: Row) => ((o.i * 31) % 100 < 30 + 30 * o.d ? '5' : '7'), [5, 7]],
  ])('%s: single-value bins, finite complier distributions', (_n, y, values) => {
    const j = expectJson(run([write(`${values[0]}.csv`, csv('score,treated,y', (o) => `${f5(o.r)},${o.d},${y(o)}`)), ...opts('--json')]));
    const o = j.outcomes[0];
    expect(o.validity.intervals).toBe(6); // 2 bins: 3 intervals per arm (METHODS §4)
    expect(o.compliers.at).toEqual(values);
    expect(o.compliers.cdf_treated[1]).toBeCloseTo(1, 9);
  });

  const ties = (): string => write('ties.csv', csv('score,treated,y', (o) => {
    const s = Math.round(o.r * 5);
    return `${s},${(o.i * 37) % 100 < (s >= 0 ? 70 : 20) ? 1 : 0},${f5(o.y)}`;
  }));
  test('heavy ties (integer scores): a rule bandwidth is widened to fit, a typed one is refused clearly, warnings when it works', () => {
    // The rules' pilots and bandwidths widen to 3 distinct scores a side (src/engine/bandwidth/bandwidthTies.ts).
    const d = expectJson(run([ties(), ...opts('--json')]));
    expect(d.bandwidth.value).toBeGreaterThan(3);
    expect(d.warnings.join(' ')).toMatch(/distinct scores below the cutoff/);
    expectRefused(run([ties(), ...opts('--bandwidth', '3')]), /holds only 2 distinct scores; the bias-corrected interval fits a curve and needs at least 3 — widen the bandwidth/);
    const j = expectJson(run([ties(), ...opts('--bandwidth', '4', '--json')]));
    expect(j.warnings.join(' ')).toMatch(/only 3 distinct scores below the cutoff/);
    expect(j.density.warnings.join(' ')).toMatch(/few distinct values/);
  });

  test('a constant treated column or outcome', () => {
    expectRefused(run([write('allone.csv', csv('score,treated,y', (o) => `${f5(o.r)},1,${f5(o.y)}`)), ...opts()]), /--treated: column "treated" is constant/);
    expectRefused(run([write('flat.csv', csv('score,treated,y', (o) => `${f5(o.r)},${o.d},3`)), ...opts()]), /--outcome: column "y" is constant/);
  });

  test('outcomes on extreme scales keep finite, scaled numbers', () => {
    for (const s of [1e-100, 1e100]) {
      const j = expectJson(run([write(`y${s}.csv`, csv('score,treated,y', (o) => `${f5(o.r)},${o.d},${Number(f5(o.y)) * s}`)), ...opts('--json')]));
      expect(j.outcomes[0].effect.estimate / s).toBeCloseTo(reference.effect, 9);
    }
  });
  // Bug left for the lead (bandwidthMse.ts/bandwidthPilots.ts): the mse rule is computed in raw
  // units, so scores scaled by 1e-50 give "bandwidth must be a positive number, got 0" and by 1e100
  // "no variation near the cutoff"; the bandwidth should simply scale with the score.
  test('scores on extreme scales give a scaled bandwidth', () => {
    for (const s of [1e-50, 1e100]) {
      const j = expectJson(run([write(`s${s}.csv`, csv('score,treated,y', (o) => `${o.r * s},${o.d},${f5(o.y)}`)), ...opts('--json')]));
      expect(j.outcomes[0].effect.estimate).toBeCloseTo(reference.effect, 3);
    }
  });
});

describe('covariates, cells and clusters', () => {
  test('a covariate with blanks: dropped rows counted in its balance row only', () => {
    const f = write('covblank.csv', csv('score,treated,y,x', (o) => `${plain(o)},${o.i % 7 === 0 ? '' : o.i % 11}`));
    const j = expectJson(run([f, ...opts('--covariate', 'x', '--json')]));
    expect(j.rows).toEqual({ read: 400, used: 400, dropped: 0 });
    expect(j.balance[0].rows).toEqual({ used: 342, dropped: 58 });
    expect(j.balance[0].pvalue).toBeGreaterThan(0);
  });

  test('a constant covariate: a warning, no numbers', () => {
    const j = expectJson(run([write('covconst.csv', csv('score,treated,y,x', (o) => `${plain(o)},3`)), ...opts('--covariate', 'x', '--json')]));
    expect(j.balance[0].warnings.join(' ')).toMatch(/x is constant on the rows used/);
    expect(j.balance[0]).not.toHaveProperty('pvalue');
  });

  test('--within with missing cell values runs on the complete rows', () => {
    const f = write('within.csv', csv('score,treated,y,g', (o) => `${plain(o)},${o.i % 10 === 0 ? '' : o.i % 3 === 0 ? 'a' : 'b'}`));
    const v = expectJson(run([f, ...opts('--within', 'g', '--json')])).outcomes[0].validity;
    expect(v.within).toBe('g');
    expect(v.window.below + v.window.above).toBeLessThanOrEqual(360);
    expect(['a', 'b']).toContain(v.worst.cell_label);
  });

  test('--within with a cell too small to fit: one line naming the cell', () => {
    const f = write('within-small.csv', csv('score,treated,y,g', (o) => `${plain(o)},${o.i === 5 || o.i === 395 ? 'rare' : o.i % 2 ? 'a' : 'b'}`));
    expectRefused(run([f, ...opts('--within', 'g')]), /within cell .*holds 0 units above the cutoff; at least 3 are needed/);
  });

  test('--cluster with a single cluster is refused; with many it runs', () => {
    const one = write('onecluster.csv', csv('score,treated,y,cl', (o) => `${plain(o)},k1`));
    expectRefused(run([one, ...opts('--cluster', 'cl')]), /--cluster: column "cl" holds 1 cluster; clustered standard errors need at least 2/);
    expectJson(run([one, ...opts('--cluster', 'cl', '--variance', 'hc0', '--json')])); // not clustered: fine
    const many = write('clusters.csv', csv('score,treated,y,cl', (o) => `${plain(o)},k${Math.floor(o.i / 10)}`));
    const j = expectJson(run([many, ...opts('--cluster', 'cl', '--json')]));
    expect(j.bandwidth.variance).toBe('cluster');
    expect(j.takeup.se).toBeGreaterThan(0.01);
  });
});

describe('files', () => {
  async function workbook(name: string, fill: (wb: ExcelJS.Workbook) => void): Promise<string> {
    const wb = new ExcelJS.Workbook();
    fill(wb);
    const p = path.join(dir, name);
    await wb.xlsx.writeFile(p);
    hashes.set(p, hash(p));
    return p;
  }
  const data = rows();

  test('XLSX: a formula column gives its saved values; a formula never calculated is named', async () => {
    const x = await workbook('formula.xlsx', (wb) => {
      const ws = wb.addWorksheet('data');
      ws.addRow(['score', 'treated', 'y', 'y2', 'unsaved']);
      data.forEach((o, k) => ws.addRow([Number(f5(o.r)), o.d, Number(f5(o.y)), { formula: `C${k + 2}*2`, result: 2 * Number(f5(o.y)) }, { formula: `C${k + 2}*3` }]));
    });
    const j = expectJson(run([x, ...opts('--outcome', 'y2', '--json')]));
    expect(j.outcomes[1].effect.estimate).toBeCloseTo(2 * reference.effect, 10);
    expectRefused(run([x, ...opts().slice(0, 4), '--outcome', 'unsaved', '--cutoff', '0']), /column "unsaved" \(outcome\), row 2: not a number, found "a formula with no saved value \(=C2\*3\)"/);
  });

  test('XLSX with an empty first sheet names the sheets; --sheet picks the data', async () => {
    const x = await workbook('emptyfirst.xlsx', (wb) => {
      wb.addWorksheet('notes');
      const ws = wb.addWorksheet('data');
      ws.addRow(['score', 'treated', 'y']);
      data.forEach((o) => ws.addRow([Number(f5(o.r)), o.d, Number(f5(o.y))]));
    });
    expectRefused(run([x, ...opts()]), /the worksheet "notes" is empty; choose a worksheet with --sheet \(the workbook has "notes", "data"\)/);
    expect(expectJson(run([x, ...opts('--sheet', 'data', '--json')])).outcomes[0].effect.estimate).toBeCloseTo(reference.effect, 12);
  });

  test('XLSX error and date cells name the column and row', async () => {
    const x = await workbook('cells.xlsx', (wb) => {
      const ws = wb.addWorksheet('data');
      ws.addRow(['score', 'treated', 'y']);
      data.forEach((o, k) => ws.addRow([k === 3 ? new Date(Date.UTC(2020, 1, 1)) : Number(f5(o.r)), o.d, k === 7 ? { error: '#DIV/0!' } : Number(f5(o.y))]));
    });
    expectRefused(run([x, ...opts()]), /column "score" \(score\), row 5: not a number, found "2020-02-01/);
  });

  test('a folder, a missing file, a text file named .xlsx, a binary file named .csv', () => {
    const folder = path.join(dir, 'folder.csv');
    fs.mkdirSync(folder);
    expectRefused(run([folder, ...opts()]), /folder\.csv is a folder, not a CSV or XLSX file/);
    expectRefused(run([path.join(dir, 'absent.csv'), ...opts()]), /absent\.csv: no such file/);
    expectRefused(run([write('text.xlsx', fs.readFileSync(good)), ...opts()]), /text\.xlsx is named as an \.xlsx workbook but holds plain text/);
    expectRefused(run([write('binary.csv', Buffer.from([1, 0, 2, 0, 3])), ...opts()]), /is neither a CSV text nor an XLSX workbook/);
  });

  const root_ = typeof process.getuid === 'function' && process.getuid() === 0;
  // Root reads a chmod 000 file anyway, so the case only means something for other users.
  (root_ ? test.skip : test)('an unreadable file', () => {
    const p = write('locked.csv', fs.readFileSync(good));
    fs.chmodSync(p, 0);
    try {
      expectRefused(run([p, ...opts()]), /locked\.csv: permission denied/);
    } finally {
      fs.chmodSync(p, 0o644);
    }
  });
});
