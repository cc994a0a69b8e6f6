// The README lists every worksheet function with an example formula on the
// demo workbook, and every setting by name (the lists in the sources are
// the reference: dist/functions.json and src/input/settings.ts).
import * as fs from 'fs';
import * as path from 'path';
import { SETTINGS } from '../../src/input/settings';

const root = path.resolve(__dirname, '..', '..');
const readme = fs.readFileSync(path.join(root, 'README.md'), 'utf8');
const meta = JSON.parse(fs.readFileSync(path.join(root, 'dist', 'functions.json'), 'utf8'));

interface Fn {
  id: string;
  parameters: Array<{ name: string; optional?: boolean }>;
}

test.each((meta.functions as Fn[]).map((f): [string, Fn] => [f.id, f]))('%s: its arguments in the table and an example formula', (id, f) => {
  const sig = f.parameters.map((p) => (p.optional ? `[${p.name}]` : p.name)).join(', ');
  expect(readme.includes(`| \`${id}\` | \`${sig}\``) || (id === 'COMPLIERDENSITY' && readme.includes('| `COMPLIERDENSITY` | same as `COMPLIERCDF`'))).toBe(true);
  expect(readme).toMatch(new RegExp(`^=CUTLINE\\.${id}\\(C2:C6001, `, 'm'));
});

test.each(SETTINGS.map((s) => [s.name]))('setting %s is in the settings table', (name) => {
  expect(readme).toMatch(new RegExp(`^\\| [^|]*\`${name}\``, 'm'));
});
