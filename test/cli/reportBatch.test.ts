// `cutline check FOLDER --out-dir DIR`: 20 generated files, one malformed: 19 pairs of reports, an index
// row for each of the 20 (the bad one with its error naming the column and row), exit 2 after all ran.
// The index's numbers are those of checking the same file alone (--json).
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { fuzzyDesignCsv } from '../helpers/fuzzyDesignCsv';
import { root, runCli } from '../helpers/runCli';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-batch-'));
const inDir = path.join(dir, 'clients');
const outDir = path.join(dir, 'reports');
const OPTS = ['--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0', '--draws', '99', '--sensitivity', '0.5,1,2'];

/** Splits one CSV line (the index quotes fields holding commas or quotes). */
function csvLine(l: string): string[] {
  const out: string[] = [];
  let cur = '';
  let q = false;
  for (let i = 0; i < l.length; i++) {
    const ch = l[i];
    if (q) {
      if (ch === '"' && l[i + 1] === '"') (cur += '"'), i++;
      else if (ch === '"') q = false;
      else cur += ch;
    } else if (ch === '"') q = true;
    else if (ch === ',') (out.push(cur), (cur = ''));
    else cur += ch;
  }
  out.push(cur);
  return out;
}

test('20 files, one malformed: 19 reports, 20 index rows, exit 2', () => {
  fs.mkdirSync(inDir);
  for (let k = 1; k <= 20; k++) {
    let text = fuzzyDesignCsv(300, k);
    if (k === 7) text = text.replace(/\n(-?[\d.]+),/g, (m, s, off) => (off > 100 && off < 140 ? '\nabc,' : m)); // a text score near the top
    fs.writeFileSync(path.join(inDir, `client${String(k).padStart(2, '0')}.csv`), text);
  }
  const r = runCli(['check', inDir, ...OPTS, '--out-dir', outDir, '--jobs', '2']);
  expect(r.code).toBe(2);
  expect(r.out).toMatch(/20 files: 19 checked, 1 failed/);
  expect(r.err).toMatch(/client07\.csv: column "score" \(score\), row \d+: not a number, found "abc"/);
  const files = fs.readdirSync(outDir).sort();
  expect(files.filter((f) => f.endsWith('.report.xlsx'))).toHaveLength(19);
  expect(files.filter((f) => f.endsWith('.report.html'))).toHaveLength(19);
  expect(files).not.toContain('client07.report.xlsx');
  expect(files.filter((f) => f.endsWith('.tmp'))).toEqual([]);
  const lines = fs.readFileSync(path.join(outDir, 'index.csv'), 'utf8').trim().split('\n').map(csvLine);
  const head = lines[0];
  expect(lines).toHaveLength(21);
  const row = (name: string): Record<string, string> => Object.fromEntries(head.map((h, i) => [h, lines.find((l) => l[0].endsWith(name))![i]]));
  expect(row('client07.csv').status).toBe('error');
  expect(row('client07.csv').error).toMatch(/column "score" \(score\), row \d+: not a number, found "abc"/);
  const one = row('client03.csv');
  expect(one.status).toBe('checked');
  const alone = JSON.parse(runCli(['check', path.join(inDir, 'client03.csv'), ...OPTS, '--json']).out);
  expect(Number(one.y_effect)).toBe(alone.outcomes[0].effect.estimate);
  expect(Number(one.y_validity_pvalue)).toBe(alone.outcomes[0].validity.pvalue);
  expect(Number(one.takeup_jump)).toBe(alone.takeup.estimate);
  const index = fs.readFileSync(path.join(outDir, 'index.html'), 'utf8');
  expect(index.match(/<tr[ >]/g)!.length).toBe(21);
  expect(index).toContain('<a href="client03.report.html">');
}, 240000);

test('several files need --out-dir; --out names one file', () => {
  const a = path.join(dir, 'a.csv');
  const b = path.join(dir, 'b.csv');
  fs.writeFileSync(a, fuzzyDesignCsv(200, 1));
  fs.writeFileSync(b, fuzzyDesignCsv(200, 2));
  const r1 = runCli(['check', a, b, ...OPTS]);
  expect(r1.code).toBe(2);
  expect(r1.err).toMatch(/need --out-dir DIR/);
  const r2 = runCli(['check', a, b, ...OPTS, '--out-dir', path.join(dir, 'o'), '--out', 'x.xlsx']);
  expect(r2.code).toBe(2);
  expect(r2.err).toMatch(/--out names one report file/);
  const r3 = runCli(['check', a, b, ...OPTS, '--out-dir', path.join(dir, 'missing', 'o')]);
  expect(r3.code).toBe(2);
  expect(r3.err).toMatch(/--out-dir: the folder .*missing does not exist/);
  const r4 = runCli(['check', a, ...OPTS, '--format', 'pdf', '--out-dir', path.join(dir, 'o')]);
  expect(r4.code).toBe(2);
  expect(r4.err).toMatch(/--format must be xlsx, html or xlsx,html/);
});

test('a progress bar on standard error only when it is a terminal (util-linux `script` gives one)', () => {
  const folder = path.join(dir, 'two');
  fs.mkdirSync(folder);
  fs.writeFileSync(path.join(folder, 'p.csv'), fuzzyDesignCsv(200, 3));
  fs.writeFileSync(path.join(folder, 'q.csv'), fuzzyDesignCsv(200, 4));
  const args = ['check', folder, ...OPTS, '--format', 'html', '--force'];
  const plain = runCli([...args, '--out-dir', path.join(dir, 'plain')]);
  expect(plain.code).toBe(0);
  expect(plain.err).toBe('');
  expect(plain.out).toBe(`2 files: 2 checked, 0 failed; index in ${path.join(dir, 'plain')}/index.html and index.csv\n`);
  const cmd = [process.execPath, path.join(root, 'bin/cutline.cjs'), ...args, '--out-dir', path.join(dir, 'tty')].map((a) => `'${a.replace(/'/g, `'\\''`)}'`).join(' ');
  const r = spawnSync('script', ['-qec', cmd, '/dev/null'], { encoding: 'utf8', cwd: root });
  expect(r.status).toBe(0);
  expect(r.stdout).toMatch(/cutline .* 2\/2 files/);
});
