/**
 * The live summary sheet as planned from the demo's summary model (issue 11):
 * every result formula depends on the cutoff cell, no formula reads a cell
 * outside the data and the settings block (other than cells the sheet itself
 * computes from them), the sheet's name never collides, the cautions are there.
 */
import { CAUTIONS } from '../../src/report/cautions';
import { boxOf, CellBox, formulaRefs, inside, overlaps } from '../../src/report/formulaRefs';
import { LiveSheetPlan } from '../../src/report/sheetPlan';
import { summarySheetName } from '../../src/report/summaryModel';
import { demoSummary } from '../helpers/demoSummary';

const { plan, model, data } = demoSummary(60, ['Data', 'Cutline summary', 'cutline SUMMARY (2)']);

/** Every cell of a box, as addresses on the summary sheet. */
function cellsOf(b: CellBox): string[] {
  const out: string[] = [];
  for (let r = b.top; r <= b.bottom; r++) for (let c = b.left; c <= b.right; c++) out.push(`${String.fromCharCode(65 + c)}${r}`);
  return out;
}

function formulaCells(p: LiveSheetPlan) {
  return p.cells.filter((c) => c.formula !== undefined);
}

describe('the live summary sheet plan (demo data, cutoff 60)', () => {
  const sheet = plan.sheet;
  const byAddress = new Map(plan.cells.map((c) => [c.address, c]));
  const dataBox: CellBox = { sheet: data.sheet, top: data.firstRow, bottom: data.lastRow, left: 0, right: 7 };
  const settingsBox = boxOf(plan.settingsBlock, sheet);
  // Cells filled by a spilling formula count as computed.
  const spilled = new Set<string>();
  for (const c of plan.cells) {
    if (!c.spill) continue;
    const b = boxOf(c.address, sheet);
    cellsOf({ ...b, bottom: b.top + c.spill.rows - 1, right: b.left + c.spill.cols - 1 }).forEach((a) => spilled.add(a));
  }

  test('has result formulas for every table of the model', () => {
    expect(formulaCells(plan).filter((c) => c.role === 'result').length).toBeGreaterThan(40);
    for (const fn of ['TAKEUP', 'JUMP', 'EFFECT', 'BANDWIDTH', 'VALIDITY', 'DENSITYTEST', 'BALANCE', 'BINS', 'COMPLIERCDF']) {
      expect(plan.cells.some((c) => c.formula?.includes(`CUTLINE.${fn}(`))).toBe(true);
    }
  });

  const notReachingCutoff = (p: LiveSheetPlan): string[] => {
    const byAddress = new Map(p.cells.map((c) => [c.address, c]));
    const memo = new Map<string, boolean>();
    const reaches = (address: string, seen: Set<string>): boolean => {
      if (address === p.cutoffCell) return true;
      if (memo.has(address)) return memo.get(address)!;
      const c = byAddress.get(address);
      if (!c?.formula || seen.has(address)) return false;
      seen.add(address);
      const ok = formulaRefs(c.formula, sheet)
        .filter((b) => b.sheet === sheet)
        .some((b) => cellsOf(b).some((a) => reaches(a, seen)));
      memo.set(address, ok);
      return ok;
    };
    const results = formulaCells(p).filter((c) => c.role === 'result');
    return results.filter((c) => !reaches(c.address, new Set())).map((c) => `${c.address}: ${c.formula}`);
  };

  test('every result formula references the cutoff cell, directly or through a cell that does', () => {
    expect(notReachingCutoff(plan)).toEqual([]);
    // The check finds a formula with the cutoff typed in, and the cells that read it.
    const takeup = plan.cells.find((c) => c.formula?.startsWith('=CUTLINE.DENSITYTEST('))!;
    const typed = { ...plan, cells: plan.cells.map((c) => (c === takeup ? { ...c, formula: c.formula!.replace(`$${plan.cutoffCell.replace(/(\d+)/, '$$$1')}`, '60') } : c)) };
    expect(typed.cells.find((c) => c.address === takeup.address)!.formula).toMatch(/, 60, /);
    expect(notReachingCutoff(typed)).toContain(`${takeup.address}: ${typed.cells.find((c) => c.address === takeup.address)!.formula}`);
  });

  test('no formula references a cell outside the data and the settings block (except cells the sheet computes from them)', () => {
    const bad: string[] = [];
    for (const c of formulaCells(plan)) {
      for (const b of formulaRefs(c.formula!, sheet)) {
        if (b.sheet === data.sheet) {
          if (!inside(b, dataBox)) bad.push(`${c.address} reads ${data.sheet} outside the data: ${c.formula}`);
          continue;
        }
        if (b.sheet !== sheet) {
          bad.push(`${c.address} reads another sheet: ${c.formula}`);
          continue;
        }
        if (inside(b, settingsBox)) continue;
        for (const a of cellsOf(b)) {
          const target = byAddress.get(a);
          if (!(target?.formula !== undefined || spilled.has(a))) bad.push(`${c.address} reads ${a}, which is neither data, a setting nor computed: ${c.formula}`);
        }
      }
    }
    expect(bad).toEqual([]);
  });

  test('the settings block holds the cutoff and named settings cells; spilled areas overlap no written cell', () => {
    expect(byAddress.get(plan.cutoffCell)).toMatchObject({ value: 60, role: 'setting' });
    expect(plan.names.map((n) => n.name)).toEqual(expect.arrayContaining(['cutline_cutoff', 'cutline_bandwidth', 'cutline_kernel', 'cutline_draws', 'cutline_seed']));
    for (const c of plan.cells.filter((x) => x.spill)) {
      const b = boxOf(c.address, sheet);
      const area = { ...b, bottom: b.top + c.spill!.rows - 1, right: b.left + c.spill!.cols - 1 };
      const clash = plan.cells.filter((o) => o !== c && overlaps(boxOf(o.address, sheet), area));
      expect(clash.map((o) => o.address)).toEqual([]);
    }
  });

  test('the sheet name never collides with a sheet the workbook has (Excel compares names ignoring case)', () => {
    expect(plan.sheet).toBe('Cutline summary (3)');
    expect(summarySheetName([])).toBe('Cutline summary');
    expect(summarySheetName(['CUTLINE SUMMARY'])).toBe('Cutline summary (2)');
    const taken = ['Data', ...Array.from({ length: 30 }, (_, k) => (k === 0 ? 'Cutline summary' : `Cutline summary (${k + 1})`))];
    const name = summarySheetName(taken);
    expect(taken.map((t) => t.toLowerCase())).not.toContain(name.toLowerCase());
    expect(plan.sheet).not.toBe(data.sheet);
  });

  test('the cautions are on the sheet: rejection, non-rejection, nearly sharp, density, judgement', () => {
    const texts = plan.cells.map((c) => String(c.value ?? ''));
    for (const line of CAUTIONS) expect(texts).toContain(line);
    const all = CAUTIONS.join(' ');
    expect(all).toMatch(/rejection/i);
    expect(all).toMatch(/does not reject is not proof/i);
    expect(all).toMatch(/nearly sharp/i);
    expect(all).toMatch(/density/i);
    expect(all).toMatch(/judgement/i);
    expect(texts).toContain('Cautions');
    expect(model.cautions.length).toBe(CAUTIONS.length);
  });

  test('the expected values are the engine’s (the model’s) for every computed cell', () => {
    const take = plan.expected.find((e) => byAddress.get(e.address)?.formula?.startsWith('=CUTLINE.TAKEUP('));
    expect(take?.value).toBe(model.tables[0].rows[0][1].value);
    expect(plan.expected.length).toBeGreaterThan(100);
  });
});
