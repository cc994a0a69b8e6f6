// `cutline check --out report.xlsx`: the written workbook read back by exceljs keeps every original
// sheet (values and formulas) and adds a summary with the engine's numbers (those of --json); LibreOffice
// (an outside spreadsheet program) opens it and prints the headline numbers into a PDF, read by pdftotext.
import { spawnSync } from 'child_process';
import * as crypto from 'crypto';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import ExcelJS from 'exceljs';
import { num } from '../../src/report/numberText';
import { fuzzyDesignRows } from '../helpers/fuzzyDesignCsv';
import { needsProgram, runCli } from '../helpers/runCli';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-xlsx-'));
const input = path.join(dir, 'client.xlsx');
const out = path.join(dir, 'client report.xlsx');
const sha = (p: string): string => crypto.createHash('sha256').update(fs.readFileSync(p)).digest('hex');

/** Every cell of a sheet as [address, value or formula]. */
function cells(ws: ExcelJS.Worksheet): Array<[string, unknown]> {
  const all: Array<[string, unknown]> = [];
  ws.eachRow({ includeEmpty: false }, (row) => row.eachCell({ includeEmpty: false }, (c) => all.push([c.address, c.formula ? { f: c.formula, r: c.result } : c.value])));
  return all;
}

let json: any;
const original = new ExcelJS.Workbook();

beforeAll(async () => {
  const ws = original.addWorksheet('Readings');
  for (const r of fuzzyDesignRows(400)) ws.addRow(r);
  // A formula column and a second sheet of notes with a formula: both must survive.
  ws.getCell('F1').value = 'double';
  for (let k = 2; k <= 401; k++) ws.getCell(`F${k}`).value = { formula: `C${k}*2`, result: Number(ws.getCell(`C${k}`).value) * 2 };
  const notes = original.addWorksheet('Cutline summary');
  notes.getCell('A1').value = 'A sheet already named like the summary';
  notes.getCell('B2').value = { formula: 'SUM(Readings!A2:A401)', result: 0 };
  await original.xlsx.writeFile(input);
  const before = sha(input);
  const base = ['check', input, '--score', 'score', '--treated', 'treated', '--outcome', 'y', '--covariate', 'age', '--cutoff', '0', '--draws', '99'];
  const r = runCli([...base, '--out', out, '--json']);
  expect(r.err).toBe('');
  expect(r.code).toBe(0);
  json = JSON.parse(r.out);
  expect(json.bins).toBeUndefined(); // the plot data of the report stay out of the JSON document
  expect(sha(input)).toBe(before);
});

test('every original sheet is kept, values and formulas, and the summary sheet gets a new name', async () => {
  const back = new ExcelJS.Workbook();
  await back.xlsx.readFile(out);
  expect(back.worksheets.map((w) => w.name)).toEqual(['Readings', 'Cutline summary', 'Cutline summary (2)']);
  for (const name of ['Readings', 'Cutline summary']) expect(cells(back.getWorksheet(name)!)).toEqual(cells(original.getWorksheet(name)!));
});

test('the summary holds the engine numbers, the formulas as text beside them, and the plots as pictures', async () => {
  const back = new ExcelJS.Workbook();
  await back.xlsx.readFile(out);
  const ws = back.getWorksheet('Cutline summary (2)')!;
  const rowOf = (label: string): ExcelJS.Row => {
    let found: ExcelJS.Row | undefined;
    ws.eachRow((row) => {
      if (!found && row.getCell(1).value === label) found = row;
    });
    if (!found) throw new Error(`no row ${label}`);
    return found;
  };
  const tk = rowOf('Take-up jump (first stage)');
  expect(tk.getCell(2).value).toBe(json.takeup.estimate);
  expect(tk.getCell(3).value).toBe(json.takeup.se);
  expect(tk.getCell(8).value).toBe(json.takeup.pvalue);
  const eff = rowOf('y: effect for compliers');
  expect(eff.getCell(2).value).toBe(json.outcomes[0].effect.estimate);
  expect(eff.getCell(6).value).toBe(json.outcomes[0].effect.ci_robust[0]);
  expect(eff.getCell(7).value).toBe(json.outcomes[0].effect.ci_robust[1]);
  // Beside the values (from column N, right of what is printed): the formula text that computes them
  // live, referencing the data sheet and the settings cells.
  expect(String(eff.getCell(14).value)).toMatch(/^CUTLINE\.EFFECT\(Readings!\$A\$2:\$A\$401, Readings!\$B\$2:\$B\$401, Readings!\$C\$2:\$C\$401, \$B\$6, \$B\$7, \$A\$9:\$B\$19\)$/);
  expect(rowOf('cutoff').getCell(2).value).toBe(0);
  expect(rowOf('bandwidth').getCell(2).value).toBe(json.bandwidth.value);
  expect(String(ws.getCell('A2').value)).toMatch(/formulas beside them are text/);
  const p = rowOf('y');
  expect(p.getCell(2).value).toBe(json.outcomes[0].validity.pvalue);
  expect(ws.getImages().length).toBeGreaterThanOrEqual(5);
});

const soffice = needsProgram('soffice', 'apt-get install -y --no-install-recommends libreoffice-calc') && needsProgram('pdftotext', 'apt-get install -y poppler-utils');
(soffice ? test : test.skip)(
  'LibreOffice opens the workbook and prints the headline numbers',
  () => {
    const pdfDir = path.join(dir, 'pdf');
    fs.mkdirSync(pdfDir);
    // A private profile: a second LibreOffice running on the machine does not block this one.
    const profile = `file://${path.join(dir, 'lo-profile')}`;
    const r = spawnSync('soffice', [`-env:UserInstallation=${profile}`, '--headless', '--convert-to', 'pdf', '--outdir', pdfDir, out], { encoding: 'utf8', timeout: 120000 });
    expect(r.status).toBe(0);
    const pdf = path.join(pdfDir, 'client report.pdf');
    const text = spawnSync('pdftotext', ['-layout', pdf, '-'], { encoding: 'utf8' }).stdout;
    expect(text).toContain('Take-up jump (first stage)');
    // The cells' number formats: four decimals below 100.
    expect(text).toContain(json.takeup.estimate.toFixed(4));
    expect(text).toContain(json.outcomes[0].effect.estimate.toFixed(4));
    // The verdict sentences, with Cutline's four significant digits.
    expect(text).toContain(`Take-up jumps by ${num(json.takeup.estimate)}`);
    expect(text).toContain(`the effect for compliers is ${num(json.outcomes[0].effect.estimate)}`);
    // The print area holds the values and pictures; the formula text is for copying, not printed.
    expect(text).not.toContain('VLOOKUP(');
  },
  180000,
);
