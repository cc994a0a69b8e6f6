/**
 * `npm run test:browser`: the task pane in headless Chromium (Debian's
 * package, driven by playwright-core) over the in-page workbook holding the
 * demo data, walked through by keyboard. It checks each bad input's message
 * beside its field with Run disabled and the workbook untouched; runs the
 * check; checks that every computed cell of the written sheet equals the
 * engine's number; types a new cutoff into the sheet's settings cell and
 * checks every computed cell again against the engine at the new cutoff.
 * Screenshots go to test-output/ (taskpane.png: the pane after the run).
 *
 * The pane is served from the build (dist/, `npm run build`) on 127.0.0.1;
 * the harness (harness.ts) is bundled here and loaded as an init script.
 */
import * as assert from 'node:assert/strict';
import * as fs from 'node:fs';
import * as http from 'node:http';
import * as path from 'node:path';
import { buildSync } from 'esbuild';
import { chromium, Page } from 'playwright-core';
import { complierCdfAt } from '../../src/engine';
import { liveExpectations } from '../../src/report/sheetPlan';
import { demoInput, demoSummary } from '../helpers/demoSummary';

// Run by npm from the repository's root.
const repo = process.cwd();
const out = path.join(repo, 'test-output');
const site = path.join(out, 'site');
const dist = path.join(repo, 'dist');
// A cutoff where take-up still rises (eligible stays above, as the sheet's settings say).
const NEW_CUTOFF = 58;

const results: Array<{ name: string; ok: boolean; detail?: string }> = [];
async function step(name: string, body: () => Promise<void>): Promise<void> {
  try {
    await body();
    results.push({ name, ok: true });
    process.stdout.write(`  ✓ ${name}\n`);
  } catch (e) {
    const detail = e instanceof Error ? e.message : String(e);
    results.push({ name, ok: false, detail });
    process.stdout.write(`  ✕ ${name}\n    ${detail.split('\n').slice(0, 12).join('\n    ')}\n`);
  }
}

/** The pane's page and scripts: the build's when there is one, else bundled here; the harness always here. */
function buildSite(): void {
  fs.rmSync(site, { recursive: true, force: true });
  fs.mkdirSync(site, { recursive: true });
  const common = { bundle: true, platform: 'browser' as const, target: 'es2020', format: 'iife' as const, logLevel: 'error' as const };
  buildSync({ ...common, entryPoints: [path.join(repo, 'test/browser/harness.ts')], outfile: path.join(site, 'harness.js') });
  if (!fs.existsSync(path.join(dist, 'taskpane.js'))) {
    buildSync({ ...common, entryPoints: [path.join(repo, 'src/taskpane/taskpane.ts')], outfile: path.join(site, 'taskpane.js') });
    for (const f of ['taskpane.html', 'taskpane.css']) fs.copyFileSync(path.join(repo, 'src/taskpane', f), path.join(site, f));
  }
}

const TYPES: Record<string, string> = { '.html': 'text/html', '.js': 'text/javascript', '.css': 'text/css', '.json': 'application/json', '.csv': 'text/csv', '.png': 'image/png' };

function serve(): Promise<http.Server> {
  const roots = [site, dist];
  const special: Record<string, string> = {
    '/demo/retrofit.csv': path.join(repo, 'demo/retrofit.csv'),
    '/fabric.min.css': path.join(repo, 'node_modules/office-ui-fabric-core/dist/css/fabric.min.css'),
  };
  // For trying the pane with another build's functions (a folder holding functions.js and functions.json).
  const other = process.env.CUTLINE_FUNCTIONS_DIR;
  if (other) for (const f of ['functions.js', 'functions.json']) special[`/${f}`] = path.join(other, f);
  const server = http.createServer((req, res) => {
    const url = decodeURIComponent((req.url ?? '/').split('?')[0]);
    let file: string | undefined = special[url];
    if (!file && url.startsWith('/office/')) {
      const inDist = path.join(dist, url);
      file = fs.existsSync(inDist) ? inDist : path.join(repo, 'node_modules/@microsoft/office-js/dist', url.slice('/office/'.length));
    }
    if (!file) file = roots.map((r) => path.join(r, url)).find((f) => f.startsWith(r0(f)) && fs.existsSync(f) && fs.statSync(f).isFile());
    if (!file || !fs.existsSync(file)) {
      if (process.env.CUTLINE_DEBUG) process.stdout.write(`    [server] 404 ${url}\n`);
      res.writeHead(404);
      res.end();
      return;
    }
    res.writeHead(200, { 'content-type': TYPES[path.extname(file)] ?? 'application/octet-stream' });
    fs.createReadStream(file).pipe(res);
  });
  const r0 = (f: string): string => (f.startsWith(site) ? site : dist);
  return new Promise((resolve) => server.listen(0, '127.0.0.1', () => resolve(server)));
}

/** Presses Tab until the element with this id has the focus (proof that the keyboard reaches it). */
async function tabTo(page: Page, id: string, shift = false): Promise<void> {
  for (let k = 0; k < 80; k++) {
    if ((await page.evaluate(() => document.activeElement?.id)) === id) return;
    await page.keyboard.press(shift ? 'Shift+Tab' : 'Tab');
  }
  throw new Error(`the keyboard does not reach #${id}`);
}

/** Types into a field reached by keyboard, replacing what it held. */
async function typeInto(page: Page, id: string, text: string): Promise<void> {
  await tabTo(page, id);
  await page.keyboard.press('Control+A');
  await page.keyboard.press('Backspace');
  if (text !== '') await page.keyboard.type(text);
}

async function press(page: Page, id: string): Promise<void> {
  await tabTo(page, id);
  await page.keyboard.press('Enter');
}

const text = (page: Page, id: string): Promise<string> => page.$eval(`#${id}`, (e) => e.textContent ?? '');
const runDisabled = (page: Page): Promise<boolean> => page.$eval('#run', (e) => (e as HTMLButtonElement).disabled);

async function untouched(page: Page): Promise<void> {
  const w = await page.evaluate(() => ({ writes: window.cutlineTest.workbook!.writes.length, sheets: window.cutlineTest.workbook!.hf.getSheetNames() }));
  assert.deepEqual(w, { writes: 0, sheets: ['Data'] }, 'the workbook was written to');
}

async function shot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: path.join(out, name), fullPage: true });
}

/** Sets a data cell as a user typing in the workbook would, then has the pane read the data again. */
async function setDataCell(page: Page, address: string, value: string | number): Promise<void> {
  await page.evaluate(([a, v]) => window.cutlineTest.workbook!.type('Data', a as string, v as string | number), [address, value]);
}

async function rereadData(page: Page, backSteps: number): Promise<void> {
  for (let k = 0; k < backSteps; k++) await press(page, 'back');
  await press(page, 'read-data');
  for (let k = 0; k < backSteps; k++) await press(page, 'next');
}

/** Largest relative difference seen between a sheet's number and the engine's. */
let worst = 0;

/** Equal, or for numbers within 1e-9 relative (the functions and the check may add in another order). */
function sameValue(sheet: unknown, engine: number | string): boolean {
  if (typeof engine === 'number') {
    if (typeof sheet !== 'number') return false;
    const rel = Math.abs(sheet - engine) / Math.max(1, Math.abs(engine));
    worst = Math.max(worst, rel);
    return rel <= 1e-9;
  }
  return String(sheet) === engine;
}

/** Every expected cell against the sheet; returns the mismatches. */
async function compareSheet(page: Page, sheet: string, expected: Array<{ address: string; value: number | string }>): Promise<string[]> {
  const got = await page.evaluate(
    async ([s, addresses]) => Promise.all((addresses as string[]).map(async (a) => (await window.cutlineTest.workbook!.readValues(s as string, a))[0][0])),
    [sheet, expected.map((e) => e.address)],
  );
  return expected.flatMap((e, k) => (sameValue(got[k], e.value) ? [] : [`${e.address}: sheet ${JSON.stringify(got[k])}, engine ${JSON.stringify(e.value)}`]));
}

/** The complier tables: the sheet's CDFs at its own grid against the engine's at the same values and the sheet's bandwidth. */
async function compareCompliers(page: Page, sheet: string, plan: ReturnType<typeof demoSummary>['plan'], cutoff: number): Promise<string[]> {
  const { input, data } = demoInput();
  const bad: string[] = [];
  const bw = (await page.evaluate(([s, a]) => window.cutlineTest.workbook!.readValues(s as string, a as string), [sheet, 'B7']))[0][0] as number;
  for (const place of plan.plots.filter((p) => p.grid)) {
    const name = place.id.slice('compliers:'.length);
    const outcome = input.outcomes.find((o) => o.name === name)!;
    assert.ok(data.columns[name] !== undefined);
    const values = (await page.evaluate(([s, a]) => window.cutlineTest.workbook!.readValues(s as string, a as string), [
      sheet,
      `A${place.row + 1}:C${place.row + place.grid!}`,
    ])) as unknown[][];
    const at = values.map((r) => r[0] as number);
    for (const [arm, col] of [[1, 1], [0, 2]] as const) {
      const ys = complierCdfAt(input.score.values, input.treated.values, outcome.values, cutoff, at, arm, {
        bandwidth: bw,
        eligible: 'above',
        missing: { score: input.score.missing, treated: input.treated.missing, outcome: outcome.missing },
      }).values;
      values.forEach((r, j) => {
        if (!sameValue(r[col], ys[j])) bad.push(`${name} arm ${arm} at ${at[j]}: sheet ${JSON.stringify(r[col])}, engine ${ys[j]}`);
      });
    }
  }
  return bad;
}

async function main(): Promise<void> {
  fs.mkdirSync(out, { recursive: true });
  buildSite();
  const server = await serve();
  const port = (server.address() as { port: number }).port;
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM ?? '/usr/bin/chromium',
    headless: true,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const page = await browser.newPage({ viewport: { width: 380, height: 900 } });
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  if (process.env.CUTLINE_DEBUG) page.on('console', (m) => process.stdout.write(`    [page] ${m.text()}\n`));
  await page.addInitScript({ path: path.join(site, 'harness.js') });
  const at60 = demoSummary(60, ['Data']);
  let sheet = '';
  try {
    await page.goto(`http://127.0.0.1:${port}/taskpane.html`);
    await page.waitForFunction(() => window.cutlineTest?.workbook !== undefined || window.cutlineTest?.error !== undefined, undefined, { timeout: 60000 });
    const harnessError = await page.evaluate(() => window.cutlineTest.error);
    if (harnessError) throw new Error(`the in-page workbook did not start: ${harnessError}\npage errors: ${errors.join('; ')}`);
    await page.waitForFunction(() => /Point at your data/.test(document.getElementById('pane-status')?.textContent ?? ''), undefined, { timeout: 30000 });
    const functions = await page.evaluate(() => window.cutlineTest.functions);
    process.stdout.write(`  functions registered from the add-in's table: ${functions.join(', ') || 'none'}\n`);

    await step('step 1: no selection — message beside the data field, Run disabled, workbook untouched', async () => {
      await shot(page, 'step-1-data.png');
      await tabTo(page, 'source-used');
      await page.keyboard.press('ArrowDown'); // the next radio: the selection
      assert.equal(await page.$eval('#source-selection', (e) => (e as HTMLInputElement).checked), true);
      await press(page, 'read-data');
      assert.match(await text(page, 'error-data'), /No cells are selected/);
      assert.equal(await runDisabled(page), true);
      await untouched(page);
      await shot(page, 'bad-no-selection.png');
    });

    await step('step 1: the used range of the data sheet', async () => {
      await tabTo(page, 'source-selection');
      await page.keyboard.press('ArrowUp');
      await press(page, 'read-data');
      assert.match(await text(page, 'data-summary'), /^6000 rows and 8 columns on Data/);
      assert.equal(await text(page, 'error-data'), '');
      await press(page, 'next');
    });

    await step('step 2: a header missing — message beside the score field, Run disabled', async () => {
      await typeInto(page, 'score', 'burden');
      assert.match(await text(page, 'error-score'), /no column named "burden"; the columns are "id", "neighbourhood", "energy_burden"/);
      assert.equal(await runDisabled(page), true);
      await typeInto(page, 'score', 'energy_burden');
      await typeInto(page, 'treated', 'retrofit');
      await typeInto(page, 'outcomes', 'heating_bill, arrears');
      await typeInto(page, 'covariates', 'dwelling_age, household_size');
      await typeInto(page, 'cluster', 'neighbourhood');
      for (const f of ['score', 'treated', 'outcomes', 'covariates', 'cluster']) assert.equal(await text(page, `error-${f}`), '', f);
      await shot(page, 'step-2-columns.png');
      await untouched(page);
    });

    await step('step 2: a text value in the score column — message beside score naming the row', async () => {
      const original = await page.evaluate(() => window.cutlineTest.workbook!.hf.getCellValue({ sheet: 0, row: 5, col: 2 }));
      await setDataCell(page, 'C6', 'high');
      await rereadData(page, 1);
      assert.match(await text(page, 'error-score'), /row 6: not a number, found "high"/);
      assert.equal(await runDisabled(page), true);
      await shot(page, 'bad-text-score.png');
      await setDataCell(page, 'C6', original as number);
      await rereadData(page, 1);
      assert.equal(await text(page, 'error-score'), '');
    });

    await step('step 2: treated not 0/1 — message beside treated naming the row', async () => {
      const original = await page.evaluate(() => window.cutlineTest.workbook!.hf.getCellValue({ sheet: 0, row: 8, col: 3 }));
      await setDataCell(page, 'D9', 2);
      await rereadData(page, 1);
      assert.match(await text(page, 'error-treated'), /column "retrofit" \(treated\), row 9: treated must be 0, 1, TRUE or FALSE, found "?2"?/);
      assert.equal(await runDisabled(page), true);
      await shot(page, 'bad-treated.png');
      await setDataCell(page, 'D9', original as number);
      await rereadData(page, 1);
      assert.equal(await text(page, 'error-treated'), '');
      await untouched(page);
      await press(page, 'next');
    });

    await step('step 3: a non-numeric cutoff, a cutoff outside the scores, then 60 with the eligible side detected', async () => {
      await typeInto(page, 'cutoff', 'sixty');
      assert.match(await text(page, 'error-cutoff'), /cutoff must be a number \(for example 60\); it is "sixty"/);
      assert.equal(await runDisabled(page), true);
      await shot(page, 'bad-cutoff-text.png');
      await typeInto(page, 'cutoff', '200');
      assert.match(await text(page, 'error-cutoff'), /cutoff 200 is outside the scores \([\d.]+ to [\d.]+\)/);
      assert.equal(await runDisabled(page), true);
      await shot(page, 'bad-cutoff-outside.png');
      await untouched(page);
      await typeInto(page, 'cutoff', '60');
      assert.equal(await text(page, 'error-cutoff'), '');
      assert.match(await text(page, 'eligible-detected'), /Detected: take-up is higher at or above the cutoff/);
      await tabTo(page, 'eligible');
      await shot(page, 'step-3-cutoff.png');
      await press(page, 'next');
    });

    await step('step 4 and 5: bandwidth by rule, checks, draws and seed', async () => {
      await tabTo(page, 'rule');
      await shot(page, 'step-4-bandwidth.png');
      await press(page, 'next');
      await tabTo(page, 'check-density');
      assert.equal(await page.$eval('#draws', (e) => (e as HTMLInputElement).value), '999');
      assert.equal(await page.$eval('#seed', (e) => (e as HTMLInputElement).value), '1');
      await shot(page, 'step-5-checks.png');
      await press(page, 'next');
      assert.equal(await runDisabled(page), false);
      await shot(page, 'step-6-run.png');
    });

    await step('Cancel right after Run writes nothing', async () => {
      await tabTo(page, 'run');
      await page.keyboard.press('Enter');
      await tabTo(page, 'cancel');
      await page.keyboard.press('Enter');
      await page
        .waitForFunction(() => /Cancelled: nothing was written/.test(document.getElementById('progress-text')?.textContent ?? ''), undefined, { timeout: 60000 })
        .catch(async () => assert.fail(`the pane says: ${await text(page, 'progress-text')}`));
      await untouched(page);
    });

    await step('Run: a determinate progress bar, the verdicts in the pane, a new sheet', async () => {
      await page.evaluate(() => {
        const seen: number[] = [];
        (window as unknown as { progressSeen: number[] }).progressSeen = seen;
        new MutationObserver(() => seen.push(Number(document.getElementById('progress')!.getAttribute('aria-valuenow')))).observe(document.getElementById('progress')!, {
          attributes: true,
          attributeFilter: ['aria-valuenow'],
        });
      });
      await tabTo(page, 'run');
      await page.keyboard.press('Enter');
      await page.waitForFunction(() => !document.getElementById('verdicts')!.hidden || /stopped/.test(document.getElementById('progress-text')!.textContent ?? ''), undefined, {
        timeout: 600000,
      });
      assert.doesNotMatch(await text(page, 'progress-text'), /stopped/, await text(page, 'progress-text'));
      const seen = await page.evaluate(() => (window as unknown as { progressSeen: number[] }).progressSeen);
      assert.ok(new Set(seen.filter((v) => v > 0 && v < 100)).size >= 3, `progress went through ${JSON.stringify(seen)}`);
      assert.equal(seen[seen.length - 1], 100);
      sheet = (await page.evaluate(() => window.cutlineTest.workbook!.hf.getSheetNames())).find((s) => s !== 'Data')!;
      const verdicts = await page.$$eval('#verdict-list li', (li) => li.map((x) => x.textContent ?? ''));
      assert.deepEqual(verdicts, at60.model.verdicts.map((v) => v.text));
      assert.equal(sheet, at60.plan.sheet);
      await shot(page, 'taskpane.png');
    });

    await step('the written sheet’s formulas evaluate to the engine’s numbers (cutoff 60)', async () => {
      const html = await page.evaluate((s) => window.cutlineTest.sheetHtml(s), sheet);
      const view = await browser.newPage({ viewport: { width: 1400, height: 900 } });
      await view.setContent(html);
      await view.screenshot({ path: path.join(out, 'summary-sheet.png'), fullPage: true });
      await view.screenshot({ path: path.join(out, 'summary-sheet-top.png'), clip: { x: 0, y: 0, width: 1400, height: 1100 } });
      const first = await view.$('svg.chart');
      const box = first ? await first.boundingBox() : null;
      if (box) await view.screenshot({ path: path.join(out, 'summary-sheet-charts.png'), fullPage: true, clip: { x: 0, y: Math.max(0, box.y - 40), width: 1400, height: 1300 } });
      await view.close();
      const bad = await compareSheet(page, sheet, at60.plan.expected);
      assert.deepEqual(bad.slice(0, 20), [], `${bad.length} of ${at60.plan.expected.length} cells differ`);
      const compliers = await compareCompliers(page, sheet, at60.plan, 60);
      assert.deepEqual(compliers.slice(0, 10), []);
      process.stdout.write(`    ${at60.plan.expected.length} computed cells equal the engine's numbers\n`);
    });

    await step(`a new cutoff typed into the settings cell recalculates every result to the engine’s numbers at ${NEW_CUTOFF}`, async () => {
      await page.evaluate(([s, a, v]) => window.cutlineTest.workbook!.type(s as string, a as string, v as number), [sheet, at60.plan.cutoffCell, NEW_CUTOFF]);
      // The engine with the sheet's settings: the eligible side as written (above).
      const at62 = demoSummary(NEW_CUTOFF, ['Data'], 'above');
      const expected = liveExpectations(at62.model, at60.model, at60.plan.cells, at60.plan.plots);
      const bad = await compareSheet(page, sheet, expected);
      const html = await page.evaluate((s) => window.cutlineTest.sheetHtml(s), sheet);
      const view = await browser.newPage({ viewport: { width: 1400, height: 900 } });
      await view.setContent(html);
      await view.screenshot({ path: path.join(out, `summary-sheet-cutoff-${NEW_CUTOFF}.png`), fullPage: true });
      await view.close();
      assert.deepEqual(bad.slice(0, 20), [], `${bad.length} of ${expected.length} cells differ`);
      const compliers = await compareCompliers(page, sheet, at60.plan, NEW_CUTOFF);
      assert.deepEqual(compliers.slice(0, 10), []);
      // The cells changed: the take-up jump at 62 is not the one at 60.
      const changed = expected.filter((e, k) => typeof e.value === 'number' && e.value !== at60.plan.expected.find((x) => x.address === e.address)?.value).length;
      assert.ok(changed > expected.length / 3, `only ${changed} cells changed`);
      process.stdout.write(`    ${expected.length} computed cells recalculated to the engine's numbers at ${NEW_CUTOFF} (${changed} changed)\n`);
    });

    await step('no script error on the page', async () => {
      assert.deepEqual(errors, []);
    });
  } finally {
    await browser.close();
    server.close();
  }
  const failed = results.filter((r) => !r.ok);
  process.stdout.write(`\n  largest relative difference between a sheet's number and the engine's: ${worst.toExponential(2)}\n`);
  process.stdout.write(`\n${results.length - failed.length} passed, ${failed.length} failed; screenshots in ${path.relative(repo, out)}/\n`);
  process.exit(failed.length ? 1 : 0);
}

main().catch((e) => {
  process.stderr.write(`${e instanceof Error ? e.stack : String(e)}\n`);
  process.exit(1);
});
