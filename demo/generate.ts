/**
 * Writes demo/retrofit.csv and demo/retrofit.xlsx from the seeded generator
 * of households.ts. Run: node bin/run-ts.cjs demo/generate.ts
 */
import * as fs from 'fs';
import * as path from 'path';
import ExcelJS from 'exceljs';
import { COLUMNS, cell, generate } from './households';

async function main(): Promise<void> {
  const rows = generate();
  const dir = path.join(process.cwd(), 'demo');
  const lines = [COLUMNS.join(',')];
  rows.forEach((h, k) => lines.push(COLUMNS.map((c) => cell(h, c, k)).join(',')));
  fs.writeFileSync(path.join(dir, 'retrofit.csv'), lines.join('\n') + '\n');
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Cutline demo generator';
  wb.created = new Date(Date.UTC(2026, 11, 1));
  wb.modified = wb.created;
  const ws = wb.addWorksheet('households');
  ws.addRow(COLUMNS);
  rows.forEach((h, k) => ws.addRow(COLUMNS.map((c) => (h[c] === null ? (k % 2 === 0 ? null : 'NA') : h[c]))));
  await wb.xlsx.writeFile(path.join(dir, 'retrofit.xlsx'));
  process.stdout.write(`wrote ${rows.length} households to demo/retrofit.csv and demo/retrofit.xlsx\n`);
}

main().catch((e) => {
  process.stderr.write(String(e) + '\n');
  process.exit(1);
});
