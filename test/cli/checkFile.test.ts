// checkFile reads the input once and hands the report writers the kind readTable decided:
// a CSV whose text begins with "PK" (a column named PKid) is still a CSV, not a zip workbook.
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { parseArgs } from '../../src/cli/args';
import { checkFile, parseCheckSpec } from '../../src/cli/checkFile';
import { fuzzyDesignCsv } from '../helpers/fuzzyDesignCsv';

test('a CSV beginning with "PK" is kept as CSV for the reports, with the bytes read', async () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-pk-'));
  const file = path.join(dir, 'pk.csv');
  const text = fuzzyDesignCsv(300)
    .trim()
    .split('\n')
    .map((l, i) => `${i === 0 ? 'PKid' : i},${l}`)
    .join('\n');
  fs.writeFileSync(file, text + '\n');
  const spec = parseCheckSpec(parseArgs(['check', file, '--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0', '--draws', '49', '--sensitivity', 'off']));
  const c = await checkFile(file, spec, true);
  expect(c.source!.isXlsx).toBe(false);
  expect(Buffer.from(c.source!.bytes).equals(fs.readFileSync(file))).toBe(true);
  expect(c.source!.table.header[0]).toBe('PKid');
});
