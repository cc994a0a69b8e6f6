// `cutline check … --within COL --json` end to end on a small deterministic dataset:
// the validity block names the cell column and its worst cell, rows with a missing cell
// are counted out of the validity test (METHODS.md §1: listwise), and an unknown column
// is a one-line refusal (exit 2). Expectations come from DESIGN.md and METHODS.md §1, §4.
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';

const root = path.resolve(__dirname, '..', '..');
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-within-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function run(args: string[]): { code: number | null; out: string; err: string } {
  const r = spawnSync(process.execPath, [path.join(root, 'bin/cutline.cjs'), ...args], { encoding: 'utf8', cwd: root });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

const REGIONS = ['north', 'south', 'east'];

/** Take-up 0.2 → 0.7 at 0; `region` cycles through REGIONS; rows in `missing` get the given marker. */
function write(name: string, missing: Map<number, string>): string {
  const lines = ['score,treated,y,region'];
  for (let i = 0; i < 300; i++) {
    const r = -1 + (2 * (i + 0.5)) / 300;
    const d = ((i * 7919) % 1000) / 1000 < (r >= 0 ? 0.7 : 0.2) ? 1 : 0;
    const y = 1 + r + 2 * d + Math.sin(i * 1.7) * 0.3;
    lines.push(`${r.toFixed(5)},${d},${y.toFixed(5)},${missing.get(i) ?? REGIONS[(i * 5) % 3]}`);
  }
  const p = path.join(dir, name);
  fs.writeFileSync(p, lines.join('\n') + '\n');
  return p;
}

const check = (file: string, within: string, ...more: string[]): string[] => [
  'check', file, '--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0',
  '--within', within, '--draws', '99', '--seed', '3', '--sensitivity', 'off', ...more,
];
const LEFT_OUT = /^(\d+) rows with a missing region were left out of the validity test/;

describe('cutline check --within', () => {
  const full = write('full.csv', new Map());
  const gaps = write('gaps.csv', new Map([[17, ''], [160, 'NA'], [251, '']]));

  test('the validity block names the column and its worst cell is one of its values', () => {
    const r = run(check(full, 'region', '--json'));
    expect(r.code).toBe(0);
    const o = JSON.parse(r.out).outcomes[0];
    expect(o.validity.within).toBe('region');
    expect(REGIONS).toContain(o.validity.worst.cell_label);
    expect(o.warnings.some((w: string) => LEFT_OUT.test(w))).toBe(false); // nothing is missing
  });

  test('missing cell values (blank, NA) are counted out of the validity test in a warning', () => {
    const r = run(check(gaps, 'region', '--json'));
    expect(r.code).toBe(0);
    const o = JSON.parse(r.out).outcomes[0];
    expect(o.validity.within).toBe('region');
    expect(REGIONS).toContain(o.validity.worst.cell_label);
    const w = o.warnings.filter((s: string) => LEFT_OUT.test(s));
    expect(w).toHaveLength(1);
    expect(Number(LEFT_OUT.exec(w[0])![1])).toBe(3); // rows 17, 160 and 251
  });

  test('an unknown --within column: exit 2, one line naming --within', () => {
    const r = run(check(full, 'regio', '--json'));
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    const lines = r.err.trimEnd().split('\n');
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(/--within/);
    expect(lines[0]).toMatch(/regio/);
  });
});
