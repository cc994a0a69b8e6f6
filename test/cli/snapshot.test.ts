// `cutline check` output, readable and --json, on the demo and on the test data, compared byte
// for byte with the committed files in test/fixtures/cli/ (the record that a refactor of the
// engine changes no number and no line). Regenerate deliberately with
// `CUTLINE_SNAPSHOT=write npx jest test/cli/snapshot.test.ts` and review the diff in git.
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';

const root = path.resolve(__dirname, '..', '..');
// CUTLINE_SNAPSHOT_DIR and CUTLINE_BIN (a bundled cutline) let the same cases be run against another build, to compare.
const store = process.env.CUTLINE_SNAPSHOT_DIR ?? path.join(root, 'test', 'fixtures', 'cli');
const bin = process.env.CUTLINE_BIN ?? path.join(root, 'bin/cutline.cjs');
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-snap-'));
const writing = process.env.CUTLINE_SNAPSHOT === 'write';

/** The deterministic fuzzy design of test/cli/cli.test.ts (take-up 0.2 → 0.7 at 0, effect 2), with a few missing cells. */
function design(n = 400): string {
  const lines = ['score,treated,y,age,g'];
  for (let i = 0; i < n; i++) {
    const r = -1 + (2 * (i + 0.5)) / n;
    const u = ((i * 7919) % 1000) / 1000;
    const d = u < (r >= 0 ? 0.7 : 0.2) ? 1 : 0;
    const y = 1 + r + 2 * d + Math.sin(i * 1.7) * 0.3;
    lines.push(`${r.toFixed(5)},${d},${i % 97 === 5 ? 'NA' : y.toFixed(5)},${30 + (i % 17)},${i % 3 === 0 ? 'a' : 'b'}`);
  }
  return lines.join('\n') + '\n';
}
fs.writeFileSync(path.join(dir, 'design.csv'), design());
for (const f of ['data_a.csv', 'data_tied.csv']) fs.copyFileSync(path.join(root, 'test/fixtures/estimates', f), path.join(dir, f));
fs.copyFileSync(path.join(root, 'demo/retrofit.csv'), path.join(dir, 'retrofit.csv'));

const demo = ['retrofit.csv', '--score', 'energy_burden', '--treated', 'retrofit', '--outcome', 'heating_bill', '--outcome', 'arrears', '--cutoff', '60'];
const demoFull = [...demo, '--covariate', 'dwelling_age', '--covariate', 'household_size', '--cluster', 'neighbourhood'];
const designArgs = ['design.csv', '--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0', '--draws', '199'];
const dataA = ['data_a.csv', '--score', 'score', '--treated', 'treated', '--outcome', 'outcome', '--outcome', 'binary', '--cutoff', '0.125', '--draws', '199'];

const cases: Array<[string, string[]]> = [
  ['demo.txt', demoFull],
  ['demo.json', [...demoFull, '--json']],
  ['demo-bins.json', [...demo, '--variance', 'hc1', '--donut', '0.5', '--draws', '199', '--bins', '--json']],
  ['demo-within.txt', [...demo, '--within', 'household_size', '--draws', '199', '--sensitivity', '0.5,1,2']],
  ['design.txt', [...designArgs, '--covariate', 'age']],
  ['design.json', [...designArgs, '--covariate', 'age', '--within', 'g', '--json']],
  ['data-a.txt', [...dataA, '--cluster', 'cluster_block', '--kernel', 'epanechnikov']],
  ['data-a.json', [...dataA, '--bandwidth', '0.3', '--variance', 'hc0', '--multiplier', 'rademacher', '--json']],
];

/** Refusals: the exit status and the one line on standard error (messages may be reworded, never lost). */
const refusals: Array<string[]> = [
  [...designArgs, '--bandwidth', '0.004'],
  [...designArgs.slice(0, 7), '--cutoff', '5'],
  [...designArgs.slice(0, 7), '--cutoff', '-5'],
  ['design.csv', '--score', 'score', '--treated', 'treated', '--outcome', 'score', '--cutoff', '0'],
  ['data_a.csv', '--score', 'score', '--treated', 'binary', '--outcome', 'treated', '--cutoff', '0.125', '--variance', 'cluster', '--cluster', 'cluster_block', '--donut', '0.01', '--bandwidth', '0.05'],
  [...designArgs, '--donut', '5'],
  [...designArgs, '--variance', 'cluster'],
  [...designArgs, '--variance', 'bogus'],
  [...designArgs, '--density-bin', '50'],
  ['data_tied.csv', '--score', 'score', '--treated', 'y_group', '--outcome', 'y_row', '--cutoff', '0.5'],
];

function run(args: string[]): { code: number | null; out: string; err: string } {
  const r = spawnSync(process.execPath, [bin, 'check', ...args], { encoding: 'utf8', cwd: dir, timeout: 120000 });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

function compare(name: string, text: string): void {
  const p = path.join(store, name);
  if (writing) fs.writeFileSync(p, text);
  expect(text).toBe(fs.readFileSync(p, 'utf8'));
}

describe('cutline check output is unchanged', () => {
  test.each(cases)('%s', (name, args) => {
    const r = run(args);
    expect({ code: r.code, err: r.err }).toEqual({ code: 0, err: '' });
    compare(name, r.out);
  });

  test('refusals', () => {
    const lines = refusals.map((args) => {
      const r = run(args);
      return `$ cutline check ${args.join(' ')}\n[${r.code}] ${r.err}${r.out}`;
    });
    compare('refusals.txt', lines.join(''));
  });
});
