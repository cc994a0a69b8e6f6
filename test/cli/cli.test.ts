// `cutline check` end to end: exit statuses, one-line errors, the JSON keys of DESIGN.md,
// and the input file left untouched. Expectations come from DESIGN.md and METHODS.md §1.
import { spawnSync } from 'child_process';
import * as crypto from 'crypto';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import ExcelJS from 'exceljs';

const root = path.resolve(__dirname, '..', '..');
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-cli-'));

function run(args: string[]): { code: number | null; out: string; err: string } {
  const r = spawnSync(process.execPath, [path.join(root, 'bin/cutline.cjs'), ...args], { encoding: 'utf8', cwd: root });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

function write(name: string, text: string): string {
  const p = path.join(dir, name);
  fs.writeFileSync(p, text);
  return p;
}

/** A small fuzzy design: take-up 0.2 → 0.7 at 0, effect 2 (deterministic, no randomness needed). */
function design(n = 400): string {
  const lines = ['score,treated,y,age,rooms'];
  for (let i = 0; i < n; i++) {
    const r = -1 + (2 * (i + 0.5)) / n;
    const u = ((i * 7919) % 1000) / 1000;
    const d = u < (r >= 0 ? 0.7 : 0.2) ? 1 : 0;
    const y = 1 + r + 2 * d + Math.sin(i * 1.7) * 0.3;
    lines.push(`${r.toFixed(5)},${d},${y.toFixed(5)},${30 + (i % 17)},${2 + ((i * 3) % 5)}`);
  }
  return lines.join('\n') + '\n';
}

const base = (file: string): string[] => ['check', file, '--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0'];

describe('cutline check', () => {
  const good = write('good.csv', design());

  test('JSON output has the keys of DESIGN.md and nothing else on stdout', () => {
    const before = crypto.createHash('sha256').update(fs.readFileSync(good)).digest('hex');
    const r = run([...base(good), '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.cutoff).toBe(0);
    expect(j.eligible).toBe('above');
    expect(j.rows).toEqual({ read: 400, used: 400, dropped: 0 });
    expect(j.bandwidth.rule).toBe('mse');
    expect(j.bandwidth.value).toBeGreaterThan(0);
    for (const k of ['estimate', 'se', 'ci', 'ci_robust', 'pvalue']) expect(j.takeup).toHaveProperty(k);
    expect(j.outcomes[0].name).toBe('y');
    expect(j.outcomes[0].effect.estimate).toBeCloseTo(j.outcomes[0].jump.estimate / j.takeup.estimate, 10);
    const after = crypto.createHash('sha256').update(fs.readFileSync(good)).digest('hex');
    expect(after).toBe(before);
  });

  test('validity, compliers, density and balance keys; Holm, sensitivity and bins', () => {
    const r = run([...base(good), '--outcome', 'age', '--covariate', 'rooms', '--draws', '199', '--bins', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    const v = j.outcomes[0].validity;
    for (const k of ['statistic', 'pvalue', 'critical_value', 'intervals', 'draws', 'seed', 'bandwidth', 'worst', 'by_bandwidth']) expect(v).toHaveProperty(k);
    expect(v.draws).toBe(199);
    expect(v.seed).toBe(1);
    expect(v.by_bandwidth.map((b: { multiple: number }) => b.multiple)).toEqual([0.5, 0.75, 1, 1.5, 2]);
    // Holm over two outcomes: the adjusted p-value of the smaller raw p is min(1, 2p) (Holm 1979).
    const ps = j.outcomes.map((o: { validity: { pvalue: number } }) => o.validity.pvalue);
    const smallest = ps.indexOf(Math.min(...ps));
    expect(j.outcomes[smallest].validity.pvalue_holm).toBeCloseTo(Math.min(1, 2 * ps[smallest]), 12);
    // Complier means differ by the complier effect (METHODS §5 consistency check).
    const o = j.outcomes[0];
    expect(o.compliers.mean_treated - o.compliers.mean_untreated).toBeCloseTo(o.effect.estimate, 9);
    expect(['local_polynomial', 'mccrary']).toContain(j.density.method);
    expect(j.density.mccrary.bin).toBeGreaterThan(0);
    expect(j.balance[0].name).toBe('rooms');
    expect(j.balance[0]).toHaveProperty('permutation_pvalue');
    expect(j.bins.map((b: { name: string }) => b.name)).toEqual(['treated', 'y', 'age', 'rooms']);
    const same = run([...base(good), '--outcome', 'age', '--covariate', 'rooms', '--draws', '199', '--bins', '--json']);
    expect(same.out).toBe(r.out); // same seed, same document
    const off = JSON.parse(run([...base(good), '--sensitivity', 'off', '--draws', '99', '--json']).out);
    expect(off.outcomes[0].validity.by_bandwidth).toHaveLength(1);
  });

  test('shuffling the rows of a file with tied scores leaves the results unchanged', () => {
    // Rounded scores (many ties): nearest-neighbour residuals, Canay–Kamat ties and the validity test must not see the row order.
    const lines = design().trim().split('\n');
    const head = lines[0];
    const body = lines.slice(1).map((l) => {
      const [r, ...rest] = l.split(',');
      return [Number(r).toFixed(1), ...rest].join(',');
    });
    const shuffled = body.map((_, i) => body[(i * 173 + 11) % body.length]); // 173 coprime with 400
    const args = ['--covariate', 'age', '--draws', '199', '--sensitivity', 'off', '--json'];
    const a = JSON.parse(run([...base(write('tied.csv', [head, ...body].join('\n'))), ...args]).out);
    const b = JSON.parse(run([...base(write('tied-shuffled.csv', [head, ...shuffled].join('\n'))), ...args]).out);
    const close = (x: number, y: number): void => expect(Math.abs(x - y)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(x)));
    close(b.bandwidth.value, a.bandwidth.value);
    for (const k of ['estimate', 'se', 'se_robust']) {
      close(b.takeup[k], a.takeup[k]);
      close(b.outcomes[0].effect[k], a.outcomes[0].effect[k]);
    }
    expect(b.outcomes[0].validity.pvalue).toBe(a.outcomes[0].validity.pvalue);
    close(b.outcomes[0].validity.statistic, a.outcomes[0].validity.statistic);
    expect(b.balance[0].permutation_pvalue).toBe(a.balance[0].permutation_pvalue);
    // Scores rounded to 0.1 are mass points: the local polynomial test cannot run and, since issue 7, McCrary's binned
    // test is no longer promoted to the headline (method 'none'); compare McCrary's numbers themselves.
    expect([a.density.method, b.density.method]).toEqual(['none', 'none']);
    close(b.density.mccrary.log_ratio, a.density.mccrary.log_ratio);
  });

  test('a donut leaves units near the cutoff out and says how many', () => {
    const j = JSON.parse(run([...base(good), '--donut', '0.05', '--draws', '99', '--json']).out);
    expect(j.donut).toEqual({ radius: 0.05, excluded: 20 });
    expect(j.rows.used).toBe(380);
  });

  test('a score with few distinct values is flagged for the density tests', () => {
    const lines = ['score,treated,y'];
    for (let i = 0; i < 600; i++) {
      const r = (i % 21) - 10;
      lines.push(`${r},${(i * 37) % 100 < (r >= 0 ? 70 : 20) ? 1 : 0},${(r + Math.sin(i)).toFixed(4)}`);
    }
    const r = run([...base(write('discrete.csv', lines.join('\n'))), '--draws', '99', '--bandwidth', '6', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.density.warnings.join(' ')).toMatch(/few distinct values/);
  });

  test('a typed bandwidth is used as typed, and XLSX gives the same numbers as CSV', async () => {
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('data');
    for (const line of design().trim().split('\n')) ws.addRow(line.split(',').map((c, i) => (i === 0 && line.startsWith('score') ? c : Number.isNaN(Number(c)) ? c : Number(c))));
    const x = path.join(dir, 'good.xlsx');
    await wb.xlsx.writeFile(x);
    const a = JSON.parse(run([...base(good), '--bandwidth', '0.5', '--json']).out);
    const b = JSON.parse(run([...base(x), '--bandwidth', '0.5', '--sheet', 'data', '--json']).out);
    expect(a.bandwidth).toMatchObject({ value: 0.5, rule: 'typed' });
    expect(b.outcomes[0].effect.estimate).toBeCloseTo(a.outcomes[0].effect.estimate, 12);
    const bad = run([...base(x), '--sheet', 'nope']);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--sheet: no worksheet named "nope"/);
  });

  test('missing values are dropped listwise and counted', () => {
    const text = design().split('\n');
    text[5] = text[5].replace(/,[^,]*,/, ',NA,');
    text[9] = text[9].replace(/^[^,]*/, '');
    const r = run([...base(write('missing.csv', text.join('\n'))), '--json']);
    expect(r.code).toBe(0);
    expect(JSON.parse(r.out).rows).toEqual({ read: 400, used: 398, dropped: 2 });
  });

  test('the readable output says the verdict-free estimates and the cautions', () => {
    const r = run(base(good));
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/Take-up jump/);
    expect(r.out).toMatch(/effect for compliers/);
    expect(r.out).toMatch(/not proof/);
  });

  const badCases: Array<[string, () => string[], RegExp]> = [
    ['missing file', () => base(path.join(dir, 'nope.csv')), /nope\.csv: no such file/],
    ['empty file', () => base(write('empty.csv', '')), /is empty/],
    ['header only', () => base(write('header.csv', 'score,treated,y\n')), /no data rows/],
    ['missing column', () => ['check', good, '--score', 'score', '--treated', 'treated', '--outcome', 'bill', '--cutoff', '0'], /--outcome: no column named "bill"/],
    ['text in the outcome', () => base(write('text.csv', design().replace(/\n(-0\.99750,\d),[^,\n]*/, '\n$1,abc'))), /column "y" \(outcome\), row 2: not a number, found "abc"/],
    ['treated not 0/1', () => base(write('treated.csv', design().replace(/\n(-0\.99750),\d/, '\n$1,2'))), /column "treated" \(treated\), row 2: treated must be 0, 1, TRUE or FALSE, found "2"/],
    ['non-finite number', () => base(write('inf.csv', design().replace(/\n(-0\.99750,\d),[^\n,]*/, '\n$1,1e999'))), /row 2: not a number, found "1e999"/],
    ['constant score', () => base(write('const.csv', 'score,treated,y\n' + '1,0,1\n1,1,2\n1,0,3\n'.repeat(5))), /the score is constant/],
    ['no unit on one side', () => [...base(good).slice(0, -1), '5'], /no unit has a score at or above the cutoff 5/],
    ['bandwidth too small', () => [...base(good), '--bandwidth', '0.004'], /holds \d units? (above|below) the cutoff; at least 3 are needed/],
    ['unreadable workbook', () => base(write('broken.xlsx', 'PK\u0003\u0004 not really a zip')), /cannot be read as an \.xlsx workbook/],
    ['cutoff not a number', () => [...base(good).slice(0, -1), 'sixty'], /--cutoff must be a number, got "sixty"/],
    ['unknown option', () => [...base(good), '--bogus', '1'], /unknown option --bogus/],
    ['bad kernel', () => [...base(good), '--kernel', 'gaussian'], /--kernel must be one of triangular, epanechnikov, uniform/],
    ['no outcome', () => ['check', good, '--score', 'score', '--treated', 'treated', '--cutoff', '0'], /--outcome is required/],
    ['draws 0', () => [...base(good), '--draws', '0'], /--draws must be a whole number of at least 1, got 0/],
    ['draws negative', () => [...base(good), '--draws', '-5'], /--draws must be a whole number of at least 1, got -5/],
    ['grid 1', () => [...base(good), '--grid', '1'], /--grid must be a whole number of at least 2, got 1/],
    ['trim negative', () => [...base(good), '--trim', '-0.1'], /--trim must be at least 0, got -0.1/],
    ['bad sensitivity', () => [...base(good), '--sensitivity', '0.5,x'], /--sensitivity must be positive multiples separated by commas, or off; got "x"/],
    ['bad multiplier', () => [...base(good), '--multiplier', 'uniform'], /--multiplier must be one of normal, rademacher/],
    ['donut empties a side', () => [...base(good), '--donut', '5'], /--donut: the donut 5 leaves no unit below the cutoff/],
    ['bin wider than the range', () => [...base(good), '--density-bin', '50'], /McCrary's density test could not be computed: .*bin/],
    ['bins without json', () => [...base(good), '--bins'], /--bins adds the binned tables to the JSON document/],
    ['constant outcome', () => base(write('consty.csv', design().replace(/^(-?[\d.]+,\d),[^,\n]*/gm, '$1,5'))), /outcome|constant|one value/],
  ];
  test.each(badCases)('bad input: %s → exit 2 and one line', (_name, args, message) => {
    const r = run(args());
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(message);
  });
});
