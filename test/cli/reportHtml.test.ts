// `cutline check --html report.html` on the demo data, rendered by headless Chromium (Debian's package):
// a screenshot for people to look at (test-output/report.png), and each plot's SVG holds one point per
// non-empty bin, bars whose counts add up to the rows of the data, and one p-value per bandwidth.
// The counts of rows come from reading the CSV here, not from Cutline.
import { spawnSync } from 'child_process';
import * as fs from 'fs';
import * as os from 'os';
import * as path from 'path';
import { chromium } from 'playwright-core';
import { num } from '../../src/report/numberText';
import { hasProgram, needsProgram, root, runCli } from '../helpers/runCli';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-html-'));
const html = path.join(dir, 'report.html');
const demo = path.join(root, 'demo', 'retrofit.csv');
const ARGS = ['--score', 'energy_burden', '--treated', 'retrofit', '--outcome', 'heating_bill', '--outcome', 'arrears', '--covariate', 'dwelling_age', '--covariate', 'household_size', '--cluster', 'neighbourhood', '--cutoff', '60', '--draws', '199'];

/** Rows of the demo CSV with every named column present (missing: empty or NA). */
function completeRows(cols: string[]): number {
  const [head, ...lines] = fs.readFileSync(demo, 'utf8').trim().split(/\r?\n/);
  const idx = cols.map((c) => head.split(',').indexOf(c));
  return lines.filter((l) => {
    const f = l.split(',');
    return idx.every((k) => f[k] !== '' && f[k].toUpperCase() !== 'NA');
  }).length;
}

interface Figure {
  id: string;
  title: string;
  desc: string;
  points: number;
  pointCounts: number[];
  bars: number;
  barCounts: number[];
  series: number;
  linePoints: number;
}

const chromiumPresent = needsProgram('chromium', 'apt-get install -y --no-install-recommends chromium');
(chromiumPresent ? test : test.skip)(
  'the page renders in Chromium with the right number of points and bins in every plot',
  async () => {
    const r = runCli(['check', demo, ...ARGS, '--html', html]);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    const j = JSON.parse(runCli(['check', demo, ...ARGS, '--json', '--bins']).out);
    const browser = await chromium.launch({
      executablePath: '/usr/bin/chromium',
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    });
    try {
      const page = await browser.newPage({ viewport: { width: 1200, height: 900 } });
      const requests: string[] = [];
      page.on('request', (q) => requests.push(q.url()));
      await page.goto(`file://${html}`);
      fs.mkdirSync(path.join(root, 'test-output'), { recursive: true });
      await page.screenshot({ path: path.join(root, 'test-output', 'report.png'), fullPage: true });
      expect(requests.every((u) => u.startsWith('file://'))).toBe(true);
      const figures: Figure[] = await page.$$eval('figure', (fs) =>
        fs.map((f) => ({
          id: f.getAttribute('data-chart') ?? '',
          title: f.querySelector('svg > title')?.textContent ?? '',
          desc: f.querySelector('svg > desc')?.textContent ?? '',
          points: f.querySelectorAll('svg circle.bin-mean').length,
          pointCounts: [...f.querySelectorAll('svg circle.bin-mean')].map((c) => Number(c.getAttribute('data-count'))),
          bars: f.querySelectorAll('svg rect.bar').length,
          barCounts: [...f.querySelectorAll('svg rect.bar')].map((c) => Number(c.getAttribute('data-count'))),
          series: f.querySelectorAll('svg path.series').length,
          linePoints: f.querySelectorAll('svg circle.line-point').length,
        })),
      );
      const sum = (a: number[]): number => a.reduce((s, v) => s + v, 0);
      const byId = new Map(figures.map((f) => [f.id, f]));
      // Take-up, both outcomes, both covariates; two complier plots; the histogram; the sensitivity plot.
      expect(figures.map((f) => f.id)).toEqual([
        'bins:retrofit', 'bins:heating_bill', 'bins:arrears', 'bins:dwelling_age', 'bins:household_size',
        'compliers:heating_bill', 'compliers:arrears', 'histogram', 'sensitivity',
      ]);
      for (const f of figures) {
        expect(f.title.length).toBeGreaterThan(5);
        expect(f.desc.length).toBeGreaterThan(40);
      }
      const columns: Record<string, string[]> = {
        retrofit: ['energy_burden', 'retrofit', 'neighbourhood'],
        heating_bill: ['energy_burden', 'retrofit', 'heating_bill', 'neighbourhood'],
        arrears: ['energy_burden', 'retrofit', 'arrears', 'neighbourhood'],
        dwelling_age: ['energy_burden', 'dwelling_age'],
        household_size: ['energy_burden', 'household_size'],
      };
      for (const b of j.bins) {
        const f = byId.get(`bins:${b.name}`)!;
        expect(f.points).toBe(b.bins.length);
        expect(f.series).toBe(2); // fit lines below and above
        expect(sum(f.pointCounts)).toBe(completeRows(columns[b.name]));
        expect(b.bins.length).toBeLessThanOrEqual(b.bins_below + b.bins_above);
      }
      const hist = byId.get('histogram')!;
      expect(hist.bars).toBe(j.bins[0].bins.length);
      expect(sum(hist.barCounts)).toBe(6000);
      for (const o of j.outcomes) expect(byId.get(`compliers:${o.name}`)!.series).toBe(2);
      const sens = byId.get('sensitivity')!;
      expect(sens.series).toBe(2);
      expect(sens.linePoints).toBe(j.outcomes.reduce((s: number, o: any) => s + o.validity.by_bandwidth.length, 0));
      expect(sens.linePoints).toBe(10);

      // Printed (A4, print styles): every figure and its caption on the page, the tables behind the
      // plots folded away. pdftotext (poppler) reads the PDF when it is installed.
      await page.emulateMedia({ media: 'print' });
      const pdf = path.join(root, 'test-output', 'report.pdf');
      await page.pdf({ path: pdf, format: 'A4', printBackground: true });
      if (hasProgram('pdftotext')) {
        const text = spawnSync('pdftotext', ['-layout', pdf, '-'], { encoding: 'utf8' }).stdout;
        for (let k = 1; k <= 9; k++) expect(text).toContain(`Figure ${k}.`);
        expect(text).toContain(`Take-up jumps by ${num(j.takeup.estimate)}`);
        expect(text).not.toContain('The numbers behind this plot');
        const pages = text.split('\f').filter((p) => p.trim() !== '').length;
        expect(pages).toBeGreaterThanOrEqual(4);
        expect(pages).toBeLessThanOrEqual(16);
      }
    } finally {
      await browser.close();
    }
  },
  120000,
);
