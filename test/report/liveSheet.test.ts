/**
 * The live summary sheet evaluated by a real spreadsheet formula engine
 * (HyperFormula, test-only) in Node, with the CUTLINE functions registered
 * from the built functions bundle (dist/functions.js, made by the build
 * before the tests) exactly as Excel is handed them: every computed cell of
 * the written sheet equals the engine's number (the check behind the pane),
 * and after typing a new cutoff into the settings cell, the engine's number at
 * that cutoff. The browser test (`npm run test:browser`) does the same through
 * the task pane.
 */
import * as fs from 'fs';
import * as path from 'path';
import { liveExpectations } from '../../src/report/sheetPlan';
import { CustomFunction, FunctionsJson, registerArrayVlookup, registerCutline } from '../browser/functionTable';
import { InPageWorkbook } from '../browser/inPageWorkbook';
import { DEMO_CSV, demoSummary } from '../helpers/demoSummary';
import { loadFunctionsBundle } from '../helpers/functionsBundle';

const dist = path.resolve(__dirname, '../../dist');

/** The sheet's value against the engine's: equal, or within 1e-9 relative for numbers. */
function differs(sheet: unknown, engine: number | string): boolean {
  if (typeof engine === 'string') return String(sheet) !== engine;
  return typeof sheet !== 'number' || Math.abs(sheet - engine) > 1e-9 * Math.max(1, Math.abs(engine));
}

test('the written sheet computes the engine’s numbers, at cutoff 60 and after typing 58 into the cutoff cell', async () => {
  // The functions bundle as the build made it, each function as it is handed to Excel.
  const table = new Map<string, CustomFunction>([...loadFunctionsBundle().functions].map(([id, fn]) => [id.toUpperCase(), fn as CustomFunction]));
  const meta = JSON.parse(fs.readFileSync(path.join(dist, 'functions.json'), 'utf8')) as FunctionsJson;
  const hints = new Map();
  expect(registerCutline(table, meta, hints, () => undefined)).toHaveLength(10);
  registerArrayVlookup();
  const cells = fs
    .readFileSync(DEMO_CSV, 'utf8')
    .trim()
    .split(/\r?\n/)
    .map((l) => l.split(',').map((c) => (c !== '' && Number.isFinite(Number(c)) ? Number(c) : c === '' ? null : c)));
  const wb = new InPageWorkbook({ sheets: { Data: cells }, active: 'Data', hints });
  const at60 = demoSummary(60, ['Data']);
  await wb.writeSheet(at60.plan, () => undefined, () => false);
  await wb.settle();
  const read = async (expected: Array<{ address: string; value: number | string }>) => {
    const bad: string[] = [];
    for (const e of expected) {
      const v = (await wb.readValues(at60.plan.sheet, e.address))[0][0];
      if (differs(v, e.value)) bad.push(`${e.address}: sheet ${JSON.stringify(v)}, engine ${JSON.stringify(e.value)}`);
    }
    return bad;
  };
  expect(at60.plan.expected.length).toBeGreaterThan(300);
  expect(await read(at60.plan.expected)).toEqual([]);

  await wb.type(at60.plan.sheet, at60.plan.cutoffCell, 58);
  const at58 = demoSummary(58, ['Data'], 'above');
  const expected = liveExpectations(at58.model, at60.model, at60.plan.cells, at60.plan.plots);
  expect(await read(expected)).toEqual([]);
  // The cutoff moved the numbers: most computed cells changed.
  const before = new Map(at60.plan.expected.map((e) => [e.address, e.value]));
  expect(expected.filter((e) => typeof e.value === 'number' && before.get(e.address) !== e.value).length).toBeGreaterThan(expected.length / 3);
}, 300000);
