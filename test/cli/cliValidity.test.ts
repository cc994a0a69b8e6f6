// `cutline check` and the validity test's two rules (docs/methods.md §4.7, §4.8) and the
// density test with mass points (§6.3): the JSON keys of DESIGN.md and the plain words of the readable output.
// Data are deterministic (no randomness); expectations follow from the rules' statements.
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';

const root = path.resolve(__dirname, '..', '..');
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-validity-'));

function run(args: string[]): { code: number | null; out: string; err: string } {
  const r = spawnSync(process.execPath, [path.join(root, 'bin/cutline.cjs'), ...args], { encoding: 'utf8', cwd: root });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

/**
 * n rows, score evenly on 40..80 (cutoff 60), outcome 900 + 3·(score − 60) + 10·treated + noise (a steep valid trend);
 * `takeup(i, above)` gives treated.
 */
function write(name: string, takeup: (i: number, above: boolean) => number, n = 800): string {
  const lines = ['score,treated,bill'];
  for (let i = 0; i < n; i++) {
    const s = 40 + (40 * (i + 0.5)) / n;
    const d = takeup(i, s >= 60);
    const noise = 4 * Math.sin(i * 12.9898) * Math.cos(i * 4.1414);
    lines.push(`${s.toFixed(3)},${d},${(900 + 3 * (s - 60) + 10 * d + noise).toFixed(3)}`);
  }
  const p = path.join(dir, name);
  fs.writeFileSync(p, lines.join('\n') + '\n');
  return p;
}

const u = (i: number): number => ((i * 7919) % 1000) / 1000;
const fuzzy = write('fuzzy.csv', (i, above) => (u(i) < (above ? 0.7 : 0.2) ? 1 : 0));
const sharp = write('sharp.csv', (_i, above) => (above ? 1 : 0));
const oneSided = write('onesided.csv', (i, above) => (above && u(i) < 0.75 ? 1 : 0));
const args = (file: string, ...more: string[]): string[] => [
  'check', file, '--score', 'score', '--treated', 'treated', '--outcome', 'bill', '--cutoff', '60', '--draws', '199', ...more,
];

describe('the trend guard', () => {
  test('JSON: the headline is the larger of the two p-values, both versions in full, by bandwidth both p-values', () => {
    const r = run(args(fuzzy, '--json'));
    expect(r.code).toBe(0);
    const v = JSON.parse(r.out).outcomes[0].validity;
    for (const k of ['applicable', 'pvalue', 'rejects', 'statistic', 'pvalue_observed', 'critical_value', 'intervals', 'draws', 'seed', 'bandwidth', 'worst', 'trend_adjusted', 'by_bandwidth'])
      expect(v).toHaveProperty(k);
    expect(v.applicable).toBe(true);
    expect(v.trend_guard).toBe('applied');
    expect(Object.keys(v.trend_adjusted).sort()).toEqual(['critical_value', 'intervals', 'pvalue', 'statistic', 'worst']);
    expect(v.pvalue).toBe(Math.max(v.pvalue_observed, v.trend_adjusted.pvalue));
    expect(v.rejects).toBe(v.pvalue <= 0.05);
    for (const b of v.by_bandwidth) {
      expect(b.pvalue).toBe(Math.max(b.pvalue_observed, b.pvalue_trend_adjusted));
    }
    expect(v.by_bandwidth.find((b: { multiple: number }) => b.multiple === 1).pvalue).toBe(v.pvalue);
  });

  test('readable: which version decided, both p-values, both worst intervals (the adjusted one in outcome units at the cutoff)', () => {
    const j = JSON.parse(run(args(fuzzy, '--json')).out).outcomes[0].validity;
    const r = run(args(fuzzy));
    expect(r.code).toBe(0);
    const which = j.decided_by === 'trend_adjusted' ? 'the version with the trend removed' : j.decided_by === 'observed' ? 'the version on the observed outcomes' : 'both versions alike';
    expect(r.out).toContain(`Decided by ${which}`);
    expect(r.out).toContain('the design is rejected only when both versions reject');
    // This steep but valid design is the false alarm of issue 7: the published test rejects, the guarded one does not.
    expect(j.pvalue_observed).toBeLessThanOrEqual(0.05);
    expect(j.rejects).toBe(false);
    expect(r.out).toContain('bill: the data do not contradict the design at 5%');
    expect(r.out).toMatch(/observed outcomes \(the published test\): p < 0\.001/);
    expect(r.out).toMatch(/outcomes with each side's quadratic trend in the score removed: p = \d\.\d{3}/);
    expect(r.out).toMatch(/worst interval \(largest t\): .* in outcome units at the cutoff \(t = /);
    expect(r.out).toMatch(/by bandwidth\s+p\s+observed\s+trend removed/);
  });

  test('--trend-guard off gives the published test alone; a wrong value is refused naming the option', () => {
    const v = JSON.parse(run(args(fuzzy, '--trend-guard', 'off', '--json')).out).outcomes[0].validity;
    expect(v.trend_guard).toBe('off');
    expect(v).not.toHaveProperty('trend_adjusted');
    expect(v.pvalue).toBe(v.pvalue_observed);
    const on = JSON.parse(run(args(fuzzy, '--trend-guard', 'on', '--json')).out).outcomes[0].validity;
    expect(on.pvalue_observed).toBe(v.pvalue_observed);
    expect(run(args(fuzzy, '--trend-guard', 'off')).out).toContain('The trend guard is off (--trend-guard off)');
    const bad = run(args(fuzzy, '--trend-guard', 'maybe'));
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/--trend-guard must be one of on, off; got "maybe"/);
  });
});

describe('arms that test nothing', () => {
  test('a sharp design: no test, and the readable output says why; JSON { applicable: false, reason }', () => {
    const r = run(args(sharp));
    expect(r.code).toBe(0);
    expect(r.out).toContain('bill: no test run');
    expect(r.out.replace(/\s+/g, ' ')).toMatch(/Why: the design is sharp in this window: no unit below the cutoff is treated and every unit above it is/);
    const v = JSON.parse(run(args(sharp, '--json')).out).outcomes[0].validity;
    expect(v).toEqual({ applicable: false, reason: expect.stringMatching(/^the design is sharp in this window/) });
  });

  test('a one-sided design names the arm left out and why', () => {
    const r = run(args(oneSided));
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/left out: the treated-arm restrictions, because no unit below the cutoff in the window is\s+treated/);
    const v = JSON.parse(run(args(oneSided, '--json')).out).outcomes[0].validity;
    expect(v.applicable).toBe(true);
    expect(v.left_out.map((a: { arm: number }) => a.arm)).toEqual([1]);
    expect(v.worst.arm).toBe(0);
  });
});

test('a score with mass points: no density headline, and both outputs say plainly that no reliable density test is available', () => {
  const lines = ['score,treated,y'];
  for (let i = 0; i < 600; i++) {
    const r = (i % 21) - 10;
    lines.push(`${r},${(i * 37) % 100 < (r >= 0 ? 70 : 20) ? 1 : 0},${(r + Math.sin(i)).toFixed(4)}`);
  }
  const file = path.join(dir, 'discrete.csv');
  fs.writeFileSync(file, lines.join('\n'));
  const base = ['check', file, '--score', 'score', '--treated', 'treated', '--outcome', 'y', '--cutoff', '0', '--draws', '99', '--bandwidth', '6'];
  const j = JSON.parse(run([...base, '--json']).out);
  expect(j.density.method).toBe('none');
  expect(j.density.reliable).toBe(false);
  expect(j.density.reason).toMatch(/^no reliable density test is available: the score takes few distinct values near the cutoff/);
  expect(j.density).not.toHaveProperty('pvalue');
  const out = run(base).out;
  expect(out).toMatch(/No density test is shown as the headline: no reliable density test is available/);
  expect(out).not.toContain('[headline]');
});
