// A sharp design (everyone above the cutoff treated, no one below): the outcome–treatment test does
// not apply, and the reports say so in words instead of failing or showing a p-value.
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import ExcelJS from 'exceljs';
import { runCli } from '../helpers/runCli';

test('reports of a sharp design say the test was not run, and why', async () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-sharp-'));
  const lines = ['score,treated,y'];
  for (let i = 0; i < 300; i++) {
    const r = -1 + (2 * (i + 0.5)) / 300;
    lines.push(`${r.toFixed(5)},${r >= 0 ? 1 : 0},${(1 + r + 2 * (r >= 0 ? 1 : 0) + Math.sin(i * 1.7) * 0.3).toFixed(5)}`);
  }
  const csv = path.join(dir, 'sharp.csv');
  fs.writeFileSync(csv, lines.join('\n') + '\n');
  const html = path.join(dir, 'sharp.html');
  const xlsx = path.join(dir, 'sharp.xlsx');
  const r = runCli(['check', csv, '--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0', '--draws', '49', '--html', html, '--out', xlsx]);
  expect(r.err).toBe('');
  expect(r.code).toBe(0);
  const page = fs.readFileSync(html, 'utf8');
  expect(page).toMatch(/The outcome–treatment test was not run: the design is sharp/);
  expect(page).not.toContain('data-chart="sensitivity"');
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(xlsx);
  const ws = wb.getWorksheet('Cutline summary')!;
  let found = false;
  ws.eachRow((row) => {
    if (row.getCell(1).value === 'y' && row.getCell(2).value === 'not applicable') found = true;
  });
  expect(found).toBe(true);
  expect(wb.getWorksheet('Data')!.rowCount).toBe(301);
});
