// Merged cells and blank-looking cells in an .xlsx (src/input/xlsx.ts; issue 9). Workbooks written by exceljs.
import ExcelJS from 'exceljs';
import { parseXlsx } from '../../src/input/xlsx';
import { cellNumber } from '../../src/input/cells';

async function book(fill: (ws: ExcelJS.Worksheet) => void): Promise<Uint8Array> {
  const wb = new ExcelJS.Workbook();
  fill(wb.addWorksheet('data'));
  return new Uint8Array((await wb.xlsx.writeBuffer()) as ArrayBuffer);
}

test('merged cells: the top-left holds the value, the hidden cells are blank (as Excel treats them)', async () => {
  const t = await parseXlsx(
    await book((ws) => {
      ws.addRow(['score', 'treated', 'y']);
      ws.addRow([1, 1, 5]);
      ws.addRow([2, 0, 6]);
      ws.addRow([3, 1, 7]);
      ws.mergeCells('B2:C3');
    }),
  );
  expect([t.get(0, 1), t.get(0, 2), t.get(1, 1), t.get(1, 2)]).toEqual([1, null, null, null]);
  expect(t.get(2, 1)).toBe(1);
});

test('a cell holding only a line break (Alt+Enter) or a non-breaking space reads as missing', async () => {
  const t = await parseXlsx(
    await book((ws) => {
      ws.addRow(['treated']);
      ws.addRow(['\n']);
      ws.addRow(['\u00a0']);
      ws.addRow([0]);
    }),
  );
  expect([0, 1, 2].map((r) => cellNumber(t.get(r, 0)))).toEqual([null, null, 0]);
});
