/**
 * The browser test's page harness, loaded before the pane's own scripts (as
 * an init script): it stands in for the runtime's `CustomFunctions` while
 * the add-in's functions bundle registers its functions, then builds the
 * in-page workbook holding the demo data with those functions registered in
 * its formula engine, and hands it to the pane as its workbook port.
 */
import { captureAssociations, CustomFunction, FunctionsJson, registerArrayVlookup, registerCutline, SpillHints } from './functionTable';
import { InPageWorkbook } from './inPageWorkbook';
import { sheetHtml } from './sheetView';
import type { WorkbookPort } from '../../src/report/workbookPort';
import type { PortCell } from '../../src/report/workbookPort';

declare global {
  interface Window {
    cutlineTest: { workbook?: InPageWorkbook; functions: string[]; sheetHtml: (sheet: string) => string; error?: string };
  }
}

const table = new Map<string, CustomFunction>();
const shim = captureAssociations(table);
// The bundle calls CustomFunctions.associate at load. office.js, loaded first, adds its own `associate` to
// the object it finds (this one) and keeps what the bundle associates in `_association.mappings`; read below.
Object.defineProperty(window, 'CustomFunctions', { get: () => shim, set: () => undefined, configurable: true });

/** A CSV text's cells as a spreadsheet shows them after opening the file: numbers as numbers. */
function csvCells(text: string): PortCell[][] {
  return text
    .trim()
    .split(/\r?\n/)
    .map((line) => line.split(',').map((c) => (c.trim() !== '' && Number.isFinite(Number(c)) ? Number(c) : c === '' ? null : c)));
}

let resolve!: (p: WorkbookPort) => void;
window.cutlineWorkbookReady = new Promise<WorkbookPort>((r) => (resolve = r));
window.cutlineTest = { functions: [], sheetHtml: (s) => sheetHtml(window.cutlineTest.workbook!, s) };

async function build(): Promise<void> {
  const [meta, csv] = await Promise.all([
    fetch('functions.json').then((r) => (r.ok ? (r.json() as Promise<FunctionsJson>) : { functions: [] })),
    fetch('demo/retrofit.csv').then((r) => r.text()),
  ]);
  // office.js installs its own `associate` on the object it finds, keeping the table in `_association.mappings`.
  const office = (window as unknown as { CustomFunctions?: { _association?: { mappings?: Record<string, CustomFunction> } } }).CustomFunctions;
  for (const [id, fn] of Object.entries(office?._association?.mappings ?? {})) table.set(id.toUpperCase(), fn);
  const hints: SpillHints = new Map();
  let wb: InPageWorkbook | undefined;
  window.cutlineTest.functions = registerCutline(table, meta, hints, () => undefined);
  registerArrayVlookup();
  wb = new InPageWorkbook({ sheets: { Data: csvCells(csv) }, active: 'Data', hints });
  window.cutlineTest.workbook = wb;
  resolve(wb);
}

document.addEventListener('DOMContentLoaded', () => {
  build().catch((e) => {
    window.cutlineTest.error = e instanceof Error ? `${e.message}\n${e.stack}` : String(e);
  });
});
