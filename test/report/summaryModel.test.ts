// The summary model without Excel: its numbers are the engine's, every result formula depends on the
// cutoff cell, formulas reference only the data and the settings block, the sheet name never collides,
// the cautions are there, and the charts have one point per bin. Expectations come from issues 11/12
// and DESIGN.md (function names); the numbers from runCheck itself.
import { runCheck } from '../../src/engine/check/check';
import { parseCsv } from '../../src/input/csv';
import { numericColumn } from '../../src/input/columns';
import { CAUTIONS } from '../../src/report/cautions';
import { cellAddress, columnLetters, columnRange, sheetPrefix } from '../../src/report/formulas';
import { buildSummary, summarySheetName } from '../../src/report/summaryModel';
import { fuzzyDesignCsv } from '../helpers/fuzzyDesignCsv';

const table = parseCsv(new TextEncoder().encode(fuzzyDesignCsv(400)), 'design.csv');
const input = {
  score: numericColumn(table, 'score', 'score'),
  treated: numericColumn(table, 'treated', 'treated'),
  outcomes: [numericColumn(table, 'y', 'outcome')],
  covariates: [numericColumn(table, 'age', 'covariate')],
};
const options = { cutoff: 0, draws: 99 };
const result = runCheck(input, { ...options, bins: true });
const data = { sheet: 'My data', firstRow: 2, lastRow: 401, columns: { score: 0, treated: 1, y: 2, age: 3 } };
const model = buildSummary(result, { source: 'design.csv', data, options, names: { score: 'score', treated: 'treated' }, takenSheetNames: ['My data'] });

/** The first outcome's validity report (the test design is fuzzy, so the test applies). */
const validity = (r = result) => {
  const v = r.outcomes[0].validity;
  if (!v.applicable) throw new Error('the test design should give an applicable validity test');
  return v;
};

const allCells = () => [...model.tables, ...model.plotTables].flatMap((t) => t.rows.flat().map((c) => ({ t, c })));

describe('formula text', () => {
  test('column letters and quoted sheet names follow A1 notation', () => {
    expect([0, 25, 26, 51, 701, 702].map(columnLetters)).toEqual(['A', 'Z', 'AA', 'AZ', 'ZZ', 'AAA']);
    expect(sheetPrefix('Data')).toBe('Data!');
    expect(sheetPrefix("Bob's data")).toBe("'Bob''s data'!");
    expect(columnRange('My data', 2, 2, 401)).toBe("'My data'!$C$2:$C$401");
    expect(cellAddress(6, 1)).toBe('$B$6');
  });
});

describe('summary model', () => {
  test('holds the engine numbers', () => {
    const est = model.tables.find((t) => t.id === 'estimates')!;
    expect(est.rows[0][1].value).toBe(result.takeup.estimate);
    expect(est.rows[0][7].value).toBe(result.takeup.pvalue);
    expect(est.rows[1][1].value).toBe(result.outcomes[0].takeup.estimate);
    expect(est.rows[3][1].value).toBe(result.outcomes[0].effect.estimate);
    expect(est.rows[3][5].value).toBe(result.outcomes[0].effect.ci_robust[0]);
    const val = model.tables.find((t) => t.id === 'validity')!;
    expect(val.rows[0][1].value).toBe(validity().pvalue);
    expect(val.rows[0][4].value).toBe(validity().observed.pvalue);
    expect(val.rows[0][6].value).toBe(validity().observed.statistic);
    const bal = model.tables.find((t) => t.id === 'balance')!;
    expect(bal.rows[0][2].value).toBe(result.balance![0].pvalue);
    expect(model.settings.find((s) => s.key === 'cutoff')!.value).toBe(0);
    expect(model.settings.find((s) => s.key === 'bandwidth')!.value).toBe(result.bandwidth.value);
    expect(model.headline.outcomes[0].effect).toBe(result.outcomes[0].effect.estimate);
  });

  test('every result formula depends on the cutoff cell, directly or through a settings cell', () => {
    const cutoff = model.settings.find((s) => s.key === 'cutoff')!.address;
    const dependsOnCutoff = new Set([cutoff, ...model.settings.filter((s) => s.formula?.includes(cutoff)).map((s) => s.address)]);
    expect(dependsOnCutoff.size).toBeGreaterThanOrEqual(3); // cutoff, bandwidth (rule), test bandwidth
    const formulas = allCells().filter(({ c }) => c.formula !== undefined);
    expect(formulas.length).toBeGreaterThan(20);
    for (const { c } of formulas) expect([...dependsOnCutoff].some((a) => c.formula!.includes(a))).toBe(true);
  });

  test('formulas reference only the data columns, the settings block, and a curve table’s own values', () => {
    const settingRows = model.settings.map((s) => Number(/\d+$/.exec(s.address)![0]));
    const [lo, hi] = [Math.min(...settingRows), Math.max(...settingRows)];
    for (const { t, c } of allCells()) {
      if (!c.formula) continue;
      // Strip the data ranges (on the data sheet) and look at what is left.
      const rest = c.formula.replace(/'My data'!\$[A-D]\$2:\$[A-D]\$401/g, '');
      expect(rest).not.toMatch(/!/);
      for (const m of rest.matchAll(/\$([A-Z]+)\$(\d+)/g)) {
        const row = Number(m[2]);
        const inSettings = row >= lo && row <= hi && (m[1] === 'A' || m[1] === 'B');
        const ownColumn = t.id.startsWith('compliers:') && m[1] === 'A' && row > t.row && row <= t.row + t.rows.length;
        expect(inSettings || ownColumn).toBe(true);
      }
    }
    expect(model.settingsRange).toMatch(/^\$A\$\d+:\$B\$\d+$/);
  });

  test('uses the worksheet function names of DESIGN.md', () => {
    const names = new Set(allCells().flatMap(({ c }) => [...(c.formula ?? '').matchAll(/CUTLINE\.([A-Z]+)\(/g)].map((m) => m[1])));
    for (const n of ['TAKEUP', 'JUMP', 'EFFECT', 'VALIDITY', 'DENSITYTEST', 'BALANCE', 'BINS', 'COMPLIERCDF']) expect(names).toContain(n);
  });

  test('verdicts in plain words; a rejection is marked as a concern and the non-rejection is not called proof', () => {
    const o = result.outcomes[0];
    const forced = (pvalue: number) => ({ ...result, outcomes: [{ ...o, validity: { ...validity(), pvalue, rejects: pvalue <= 0.05 } }] });
    const ctx = { source: 'design.csv', data, options, names: { score: 'score', treated: 'treated' } };
    const m1 = buildSummary(forced(0.4), ctx);
    expect(m1.verdicts[1]).toEqual({
      text: expect.stringMatching(/^y: the effect for compliers is .*does not reject \(p = 0\.400\).*which is not proof that it holds\.$/),
      concern: false,
    });
    const m2 = buildSummary(forced(0.012), ctx);
    expect(m2.verdicts[1].concern).toBe(true);
    expect(m2.verdicts[1].text).toMatch(/rejects \(p = 0\.012\): the data contradict the design for this outcome/);
    expect(model.verdicts[1].concern).toBe(validity().rejects);
    const sharp = { ...result, outcomes: [{ ...o, validity: { applicable: false as const, reason: 'take-up is 0 or 1 on each side', bandwidth: 0.3, counts: { below: 9, above: 9 }, warnings: [] } }] };
    const m3 = buildSummary(sharp, ctx);
    expect(m3.verdicts[1]).toEqual({ text: expect.stringMatching(/The outcome–treatment test was not run: take-up is 0 or 1 on each side\.$/), concern: false });
    expect(m3.tables.find((t) => t.id === 'validity')!.rows[0][1].value).toBe('not applicable');
    expect(m3.headline.outcomes[0].validity_pvalue).toBeUndefined();
    expect(m2.tables.find((t) => t.id === 'validity')!.rows[0][3].value).toBe('contradicted');
  });

  test('the sheet name never collides (Excel compares names ignoring case)', () => {
    expect(summarySheetName([])).toBe('Cutline summary');
    expect(summarySheetName(['cutline SUMMARY', 'Cutline summary (2)'])).toBe('Cutline summary (3)');
    expect(model.sheetName).toBe('Cutline summary');
  });

  test('the cautions are present, in plain words', () => {
    expect(model.cautions).toEqual([...CAUTIONS]);
    const all = model.cautions.join(' ');
    for (const w of [/rejection .* contradict/, /does not reject is not proof/, /nearly sharp/, /density of the score/, /does not replace.*judgement/]) expect(all).toMatch(w);
  });

  test('tables do not overlap on the sheet', () => {
    const spans = [...model.tables, ...model.plotTables].map((t) => [t.row - 1, t.row + t.rows.length + (t.note ? 1 : 0)]);
    for (const b of model.textBlocks) spans.push([b.row, b.row + b.lines.length]);
    // A picture of 400 px covers 20 rows of 20 px from its anchor; its heading is the row above.
    for (const c of model.charts) spans.push([c.anchor!.row - 1, c.anchor!.row + 19]);
    spans.sort((a, b) => a[0] - b[0]);
    // Charts share rows two by two; the rest must follow one another.
    const merged = spans.reduce<number[][]>((acc, s) => {
      const last = acc[acc.length - 1];
      if (last && s[0] === last[0] && s[1] === last[1]) return acc;
      acc.push(s);
      return acc;
    }, []);
    for (let i = 1; i < merged.length; i++) expect([i, merged[i][0]]).toEqual([i, Math.max(merged[i][0], merged[i - 1][1] + 1)]);
    const lastSetting = Math.max(...model.settings.map((s) => Number(/\d+$/.exec(s.address)![0])));
    expect(merged[0][0]).toBeGreaterThan(lastSetting);
  });

  test('charts: one point per non-empty bin, one bar per bin, one p-value per bandwidth', () => {
    const tk = result.bins!.find((b) => b.name === 'treated')!;
    const takeup = model.charts.find((c) => c.id === 'bins:treated')!;
    expect(takeup.points!.map((p) => p.x)).toEqual(tk.bins.map((b) => b.midpoint));
    expect(takeup.yDomain).toEqual([0, 1]);
    const hist = model.charts.find((c) => c.id === 'histogram')!;
    expect(hist.bars!.reduce((s, b) => s + b.count, 0)).toBe(400);
    const sens = model.charts.find((c) => c.id === 'sensitivity')!;
    expect(sens.lines![0].points.length).toBe(validity().by_bandwidth.length);
    for (const c of model.charts) {
      expect(c.title.length).toBeGreaterThan(5);
      expect(c.alt.length).toBeGreaterThan(40);
      expect(c.xLabel && c.yLabel).toBeTruthy();
    }
  });
});
