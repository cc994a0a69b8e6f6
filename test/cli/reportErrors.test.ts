// Report paths that must be refused (issue 12): a missing folder, the input itself, an existing file
// without --force, a location that cannot be written. Each: one clear line, exit 2, the input unchanged
// and nothing (not even a temporary file) left behind.
import * as crypto from 'crypto';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import ExcelJS from 'exceljs';
import { fuzzyDesignCsv, fuzzyDesignRows } from '../helpers/fuzzyDesignCsv';
import { runCli } from '../helpers/runCli';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-out-'));
const csv = path.join(dir, 'input.csv');
fs.writeFileSync(csv, fuzzyDesignCsv(300));
const OPTS = ['--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0', '--draws', '49', '--sensitivity', 'off'];
const sha = (p: string): string => crypto.createHash('sha256').update(fs.readFileSync(p)).digest('hex');
const listing = (d: string): string[] => fs.readdirSync(d).sort();

function refused(args: string[], message: RegExp, input = csv): void {
  const before = sha(input);
  const files = listing(dir);
  const r = runCli(['check', input, ...OPTS, ...args]);
  expect(r.code).toBe(2);
  expect(r.err).toMatch(message);
  expect(r.err.trim().split('\n')).toHaveLength(1);
  expect(r.err).not.toMatch(/\n\s+at /);
  expect(sha(input)).toBe(before);
  expect(listing(dir)).toEqual(files);
}

test('an output path in a missing folder', () => {
  refused(['--out', path.join(dir, 'nope', 'r.xlsx')], /^cutline: --out: the folder .*nope does not exist/);
  refused(['--html', path.join(dir, 'nope', 'r.html')], /^cutline: --html: the folder .*nope does not exist/);
});

test('the input itself is never overwritten, even with --force', async () => {
  const wb = new ExcelJS.Workbook();
  const ws = wb.addWorksheet('d');
  for (const r of fuzzyDesignRows(300)) ws.addRow(r);
  const xlsx = path.join(dir, 'input.xlsx');
  await wb.xlsx.writeFile(xlsx);
  refused(['--out', xlsx, '--force'], /^cutline: --out: .*input\.xlsx is an input file; Cutline never overwrites its input/, xlsx);
  // The same file reached through another spelling of its path.
  refused(['--out', path.join(dir, '.', 'nope', '..', 'input.xlsx')], /nope does not exist|is an input file/, xlsx);
  refused(['--out', `${dir}/./input.xlsx`], /is an input file/, xlsx);
});

test('an existing report is replaced only with --force', () => {
  const out = path.join(dir, 'existing.html');
  fs.writeFileSync(out, 'an earlier report');
  refused(['--html', out], /^cutline: --html: .*existing\.html already exists; give --force to replace it/);
  expect(fs.readFileSync(out, 'utf8')).toBe('an earlier report');
  const r = runCli(['check', csv, ...OPTS, '--html', out, '--force']);
  expect(r.code).toBe(0);
  expect(r.out.endsWith(`\nReports written: ${out}\n`)).toBe(true);
  expect(fs.readFileSync(out, 'utf8')).toMatch(/^<!DOCTYPE html>/);
  fs.unlinkSync(out);
});

test('a wrong extension names the option', () => {
  refused(['--out', path.join(dir, 'r.csv')], /^cutline: --out writes an Excel workbook: give a name ending in \.xlsx/);
  refused(['--html', path.join(dir, 'r.txt')], /^cutline: --html writes a web page: give a name ending in \.html/);
});

test('a location that cannot be written', () => {
  // Root may write anywhere on a normal file system, but not into /sys; others get a read-only folder.
  let target: string;
  let ro: string | undefined;
  if (process.getuid?.() === 0) target = '/sys/cutline-report.xlsx';
  else {
    ro = path.join(dir, 'readonly');
    fs.mkdirSync(ro);
    fs.chmodSync(ro, 0o555);
    target = path.join(ro, 'r.xlsx');
  }
  const before = sha(csv);
  const r = runCli(['check', csv, ...OPTS, '--out', target]);
  expect(r.code).toBe(2);
  expect(r.err).toMatch(/^cutline: --out: cannot write (in the folder .* \(permission denied\)|.*cutline-report\.xlsx \(permission denied\); nothing was written)/);
  expect(fs.existsSync(target)).toBe(false);
  if (ro) expect(listing(ro)).toEqual([]);
  else expect(fs.readdirSync('/sys').filter((f) => f.includes('cutline'))).toEqual([]);
  expect(sha(csv)).toBe(before);
});
